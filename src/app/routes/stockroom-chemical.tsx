/** A chemical's page. */
import { useParams } from "react-router-dom";
import { ChemicalDetail } from "@/features/stockroom/components/chemical-detail";
import { NotFoundRoute } from "./not-found";

export function ChemicalRoute() {
  const id = Number(useParams().id);
  return Number.isInteger(id) && id > 0 ? <ChemicalDetail id={id} /> : <NotFoundRoute />;
}
