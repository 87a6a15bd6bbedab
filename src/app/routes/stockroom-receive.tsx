/** Receiving a delivery (manager, safety officer). */
import { useSearchParams } from "react-router-dom";
import { PageHeader } from "@/components/ui/page-header";
import { ReceiveForm } from "@/features/stockroom/components/receive-form";

export function ReceiveRoute() {
  const [params] = useSearchParams();
  const chemicalId = Number(params.get("chemicalId")) || undefined;
  return (
    <>
      <PageHeader title="Receive a delivery" description="One line per delivery: Phasebook makes a container with its own label for each bottle." />
      <ReceiveForm chemicalId={chemicalId} />
    </>
  );
}
