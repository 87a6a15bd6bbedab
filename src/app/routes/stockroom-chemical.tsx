/** A chemical's page; managers and safety officers can print labels for a selection of its containers. */
import { useParams } from "react-router-dom";
import { hasRole, useUser } from "@/lib/auth";
import { ChemicalDetail } from "@/features/stockroom/components/chemical-detail";
import { PrintLabelsButton } from "@/features/labels/components/print-labels-button";
import { NotFoundRoute } from "./not-found";

const printSelected = (ids: number[]) => <PrintLabelsButton containerIds={ids} label={`Print labels for ${ids.length} selected`} />;

export function ChemicalRoute() {
  const id = Number(useParams().id);
  const { data: user } = useUser();
  const mayPrint = hasRole(user, "manager", "safety_officer");
  if (!Number.isInteger(id) || id <= 0) return <NotFoundRoute />;
  return <ChemicalDetail id={id} containerSelectionActions={mayPrint ? printSelected : undefined} />;
}
