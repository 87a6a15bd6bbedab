/**
 * An instrument's fault reports: the open ones, a "Report a fault" form for everyone the server
 * allows (`abilities.reportFault`), and closing a report with what was done where it allows that
 * (`abilities.closeFault`). Reporting leaves the status alone: the manager decides.
 */
import { useId, useState } from "react";
import { useForm, type Resolver } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { closeFaultInput, reportFaultInput, type FaultDto, type InstrumentDetailDto } from "@shared/schemas/instruments";
import { applyServerFieldErrors, describeError } from "@/lib/forms";
import { formatDateTime } from "@/lib/format";
import { Alert } from "@/components/ui/alert";
import { Button, type ButtonVariant } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { controlClasses, Field } from "@/components/ui/field";
import { useCloseFault, useReportFault } from "../api/instrument";

interface NoteFormProps {
  schema: z.ZodType;
  field: "note" | "resolution";
  label: string;
  hint?: string;
  submitLabel: string;
  variant?: ButtonVariant;
  testId: string;
  done?: string;
  onSubmit: (text: string) => Promise<unknown>;
}

/** One text field, validated with the shared schema as you type; the server's field errors land on it. */
function NoteForm({ schema, field, label, hint, submitLabel, variant = "secondary", testId, done, onSubmit }: NoteFormProps) {
  const id = useId();
  const [error, setError] = useState<string | null>(null);
  const [ok, setOk] = useState(false);
  const form = useForm<Record<string, string>>({ resolver: zodResolver(schema as never) as Resolver<Record<string, string>>, mode: "onTouched", defaultValues: { [field]: "" } });
  const message = form.formState.errors[field]?.message;
  const submit = form.handleSubmit(async (values) => {
    setError(null);
    setOk(false);
    try {
      await onSubmit(values[field] ?? "");
      form.reset();
      setOk(true);
    } catch (e) {
      if (!applyServerFieldErrors(e, form.setError, [field])) setError(describeError(e));
    }
  });
  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-2" data-testid={testId}>
      {error && <Alert tone="danger">{error}</Alert>}
      {ok && done && <Alert tone="ok">{done}</Alert>}
      <Field id={id} label={label} hint={hint} error={message}>
        <textarea id={id} rows={2} className={controlClasses(Boolean(message), "py-1.5")} aria-invalid={message ? true : undefined} {...form.register(field)} />
      </Field>
      <div>
        <Button type="submit" variant={variant} loading={form.formState.isSubmitting}>
          {submitLabel}
        </Button>
      </div>
    </form>
  );
}

function OpenFault({ fault, instrumentId, mayClose, zone }: { fault: FaultDto; instrumentId: number; mayClose: boolean; zone: string | undefined }) {
  const close = useCloseFault(instrumentId);
  const [closing, setClosing] = useState(false);
  return (
    <li className="flex flex-col gap-2 py-2" data-testid={`fault-${fault.id}`}>
      <p className="text-sm">
        <span className="text-grey-600">
          {formatDateTime(fault.reportedAt, zone)}
          {fault.reportedBy ? ` · ${fault.reportedBy}` : ""}:
        </span>{" "}
        {fault.note}
      </p>
      {mayClose &&
        (closing ? (
          <NoteForm
            schema={closeFaultInput}
            field="resolution"
            label="What was done"
            submitLabel="Close the report"
            testId={`close-fault-form-${fault.id}`}
            onSubmit={(resolution) => close.mutateAsync({ faultId: fault.id, resolution })}
          />
        ) : (
          <div>
            <Button size="sm" onClick={() => setClosing(true)} data-testid={`close-fault-${fault.id}`}>
              Close…
            </Button>
          </div>
        ))}
    </li>
  );
}

export function InstrumentFaults({ instrument: i, zone }: { instrument: InstrumentDetailDto; zone: string | undefined }) {
  const report = useReportFault(i.id);
  return (
    <Card title="Faults" description="Reports nobody has closed yet. The manager is e-mailed each report and decides whether the instrument leaves service.">
      <div className="flex flex-col gap-3" data-testid="instrument-faults">
        {i.openFaults.length === 0 ? (
          <p className="text-sm text-grey-600">No open fault reports.</p>
        ) : (
          <ul className="divide-y divide-grey-100">
            {i.openFaults.map((f) => (
              <OpenFault key={f.id} fault={f} instrumentId={i.id} mayClose={i.abilities.closeFault} zone={zone} />
            ))}
          </ul>
        )}
        {i.abilities.reportFault && (
          <NoteForm
            schema={reportFaultInput}
            field="note"
            label="Report a fault"
            hint="What is wrong, as the next person would need to know it."
            submitLabel="Report the fault"
            variant="danger"
            testId="report-fault-form"
            done="Reported. The manager has been told."
            onSubmit={(note) => report.mutateAsync(note)}
          />
        )}
      </div>
    </Card>
  );
}
