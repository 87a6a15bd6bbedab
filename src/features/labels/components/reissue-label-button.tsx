/**
 * "Issue a new label" for a container or instrument (manager, safety officer): the old code
 * stops opening the record at once (it then answers "this label was replaced"), so the person
 * confirms first and may say why; the caller refreshes whatever shows the token.
 */
import { useState } from "react";
import type { LabelledTypeName } from "@shared/schemas/labels";
import { describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/input";
import { useConfirm, type ConfirmOptions } from "@/components/ui/confirm-dialog";
import { useReissueLabel } from "../api/scan-actions";

/** What the person is asked before a new label replaces the one on the bottle or instrument. */
export function reissueQuestion(type: LabelledTypeName): ConfirmOptions {
  return {
    title: "Issue a new label?",
    description: `The label now on the ${type} stops working at once: scanning it will say it was replaced. Print the new label and put it on.`,
    confirmLabel: "Issue a new label",
    keepLabel: "Keep the old label",
  };
}

interface ReissueLabelButtonProps {
  type: LabelledTypeName;
  id: number;
  onReissued?: (token: string) => void;
}

export function ReissueLabelButton({ type, id, onReissued }: ReissueLabelButtonProps) {
  const reissue = useReissueLabel();
  const [reason, setReason] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState(false);
  const [confirmation, confirm] = useConfirm();
  const run = async () => {
    setError(null);
    setDone(false);
    if (!(await confirm(reissueQuestion(type)))) return;
    try {
      const r = await reissue.mutateAsync({ type, id, reason });
      setReason("");
      setDone(true);
      onReissued?.(r.token);
    } catch (e) {
      setError(describeError(e));
    }
  };
  return (
    <div className="flex flex-col gap-2">
      {confirmation}
      <div className="flex flex-wrap items-end gap-2">
        <Input label="Reason for a new label (optional)" value={reason} onChange={(e) => setReason(e.target.value)} maxLength={300} fieldClassName="w-72" />
        <Button variant="danger" onClick={run} loading={reissue.isPending} data-testid="reissue-label">Issue a new label</Button>
      </div>
      {done && <Alert tone="ok">New label issued; print it and put it on. The old label no longer opens this record.</Alert>}
      {error && <Alert tone="danger">{error}</Alert>}
    </div>
  );
}
