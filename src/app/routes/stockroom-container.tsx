/** A container's page: where a scanned label lands; managers and safety officers also print or re-issue its label here. */
import { useParams } from "react-router-dom";
import { useQueryClient } from "@tanstack/react-query";
import type { ContainerDto } from "@shared/schemas/stock";
import { hasRole, useUser } from "@/lib/auth";
import { ContainerDetail } from "@/features/stockroom/components/container-detail";
import { stockKeys } from "@/features/stockroom/api/keys";
import { PrintLabelsButton } from "@/features/labels/components/print-labels-button";
import { ReissueLabelButton } from "@/features/labels/components/reissue-label-button";
import { NotFoundRoute } from "./not-found";

function ContainerLabelTools({ container }: { container: ContainerDto }) {
  const queryClient = useQueryClient();
  return (
    <>
      <PrintLabelsButton containerIds={[container.id]} label="Print the label" />
      <ReissueLabelButton type="container" id={container.id} onReissued={() => queryClient.invalidateQueries({ queryKey: stockKeys.container(container.id) })} />
    </>
  );
}

export function ContainerRoute() {
  const id = Number(useParams().id);
  const { data: user } = useUser();
  // GET /api/labels.pdf and the re-issue route are the manager's and the safety officer's.
  const mayLabel = hasRole(user, "manager", "safety_officer");
  if (!Number.isInteger(id) || id <= 0) return <NotFoundRoute />;
  return <ContainerDetail key={id} id={id} labelTools={mayLabel ? (c) => <ContainerLabelTools container={c} /> : undefined} />;
}
