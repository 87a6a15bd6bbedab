/** A new run plan: the form with its live picture; saving opens the plan, where it is reserved for a booking. */
import { useNavigate } from "react-router-dom";
import { paths } from "@/config/paths";
import { PageHeader } from "@/components/ui/page-header";
import { SCREEN_HEADS } from "@shared/screens";
import { RunPlanForm } from "@/features/run-plans/components/run-plan-form";
import { RunPlanConventions } from "@/features/run-plans/components/conventions";

export function NewRunPlanRoute() {
  const navigate = useNavigate();
  return (
    <>
      <PageHeader {...SCREEN_HEADS.runPlanNew} />
      <RunPlanConventions />
      <RunPlanForm onSaved={(plan) => navigate(paths.runPlan.getHref(plan.id))} />
    </>
  );
}
