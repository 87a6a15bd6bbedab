/** The label part of a scanned record: print this label, or issue a new one (the old one stops working). */
import { useState } from "react";
import { useNavigate } from "react-router-dom";
import type { ScanResultDto } from "@shared/schemas/scan";
import { paths } from "@/config/paths";
import { describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { Button, buttonClasses } from "@/components/ui/button";
import { Input } from "@/components/ui/input";
import { useConfirm } from "@/components/ui/confirm-dialog";
import { useReissueLabel } from "../api/scan-actions";
import { labelsPdfHref } from "../api/get-label-stocks";
import { reissueQuestion } from "./reissue-label-button";
import { Section } from "./scan-section";

export function LabelTools({ scan, token }: { scan: ScanResultDto; token: string }) {
  const reissue = useReissueLabel();
  const navigate = useNavigate();
  const [reason, setReason] = useState("");
  const [error, setError] = useState<string | null>(null);
  const href = labelsPdfHref(scan.type === "container" ? { containerIds: [scan.id] } : { instrumentIds: [scan.id] });
  const [confirmation, confirm] = useConfirm();
  const doReissue = async () => {
    setError(null);
    if (!(await confirm(reissueQuestion(scan.type)))) return;
    try {
      const r = await reissue.mutateAsync({ type: scan.type, id: scan.id, reason });
      navigate(paths.scanToken.getHref(r.token), { replace: true, state: { reissued: true } });
    } catch (e) {
      setError(describeError(e));
    }
  };
  return (
    <Section title="Label" testId="scan-label-tools">
      <div className="flex flex-col gap-2">
        {confirmation}
        <a className={buttonClasses("secondary", "md", "self-start")} href={href} target="_blank" rel="noopener" data-testid="scan-print-label">
          Print this label (PDF)
        </a>
        <p className="text-xs text-grey-600">
          Label code <span className="font-mono break-all">{token}</span>
        </p>
        {error && <Alert tone="danger">{error}</Alert>}
        <Input label="Reason for a new label (optional)" value={reason} onChange={(e) => setReason(e.target.value)} maxLength={300} />
        <div>
          <Button variant="danger" onClick={doReissue} loading={reissue.isPending} data-testid="scan-reissue">
            Issue a new label
          </Button>
        </div>
      </div>
    </Section>
  );
}
