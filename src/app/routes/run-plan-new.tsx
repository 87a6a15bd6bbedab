/** A new run plan: the form with its live picture; saving opens the plan, where it is reserved for a booking. */
import { useNavigate } from "react-router-dom";
import { paths } from "@/config/paths";
import { PageHeader } from "@/components/ui/page-header";
import { RunPlanForm } from "@/features/run-plans/components/run-plan-form";
import { RunPlanConventions } from "@/features/run-plans/components/conventions";

export function NewRunPlanRoute() {
  const navigate = useNavigate();
  return (
    <>
      <PageHeader title="Plan a run" description="Choose the two phases' electrolytes and the ions you want to see; Phasebook shows the window, where each ion transfers, its current, and what to weigh." />
      <RunPlanConventions />
      <RunPlanForm onSaved={(plan) => navigate(paths.runPlan.getHref(plan.id))} />
    </>
  );
}
