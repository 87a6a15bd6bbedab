/** Receiving a delivery (manager, safety officer). */
import { useSearchParams } from "react-router-dom";
import { PageHeader } from "@/components/ui/page-header";
import { SCREEN_HEADS } from "@shared/screens";
import { ReceiveForm } from "@/features/stockroom/components/receive-form";

export function ReceiveRoute() {
  const [params] = useSearchParams();
  const chemicalId = Number(params.get("chemicalId")) || undefined;
  return (
    <>
      <PageHeader {...SCREEN_HEADS.receive} />
      <ReceiveForm chemicalId={chemicalId} />
    </>
  );
}
