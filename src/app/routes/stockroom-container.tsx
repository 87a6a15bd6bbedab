/** A container's page: where a scanned label lands. */
import { useParams } from "react-router-dom";
import { ContainerDetail } from "@/features/stockroom/components/container-detail";
import { NotFoundRoute } from "./not-found";

export function ContainerRoute() {
  const id = Number(useParams().id);
  return Number.isInteger(id) && id > 0 ? <ContainerDetail key={id} id={id} /> : <NotFoundRoute />;
}
