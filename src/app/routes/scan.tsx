/** Scan: read a QR label with the phone camera, a photo, or the typed code, and open its record. */
import { PageHeader } from "@/components/ui/page-header";
import { ScanPanel } from "@/features/labels/components/scan-panel";

export function ScanRoute() {
  return (
    <>
      <PageHeader title="Scan" description="Point the camera at the QR label on a bottle, a vial or a cell to open its record." />
      <ScanPanel />
    </>
  );
}
