/** One run plan: picture, numbers, what to weigh, the reservation and the cautions. */
import { Link, useParams } from "react-router-dom";
import { paths } from "@/config/paths";
import { describeError } from "@/lib/forms";
import { useFacilityZone } from "@/lib/facility";
import { Alert } from "@/components/ui/alert";
import { PageHeader } from "@/components/ui/page-header";
import { LoadingLine } from "@/components/ui/spinner";
import { useRunPlan } from "@/features/run-plans/api/run-plans";
import { RunPlanView } from "@/features/run-plans/components/run-plan-view";
import { RunPlanConventions } from "@/features/run-plans/components/conventions";

export function RunPlanRoute() {
  const id = Number(useParams().id);
  const plan = useRunPlan(id);
  const zone = useFacilityZone();
  if (plan.isPending || !zone) return <LoadingLine label="Loading the run plan" />;
  if (plan.isError) return <Alert tone="danger">{describeError(plan.error)}</Alert>;
  const p = plan.data;
  return (
    <>
      <PageHeader title={p.title} description={`Run plan by ${p.authorName}`} actions={<Link to={paths.runPlanNew.getHref()}>Plan another run</Link>} />
      <RunPlanConventions />
      <RunPlanView plan={p} zone={zone} />
    </>
  );
}
