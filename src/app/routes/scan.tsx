/** Scan: read a QR label with the phone camera, a photo, or the typed code, and open its record. */
import { PageHeader } from "@/components/ui/page-header";
import { SCREEN_HEADS } from "@shared/screens";
import { ScanPanel } from "@/features/labels/components/scan-panel";

export function ScanRoute() {
  return (
    <>
      <PageHeader {...SCREEN_HEADS.scan} />
      <ScanPanel />
    </>
  );
}
