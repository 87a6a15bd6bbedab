/** A one-note form for a quick action (report a problem, a waste note, a fault), validated with the shared schema. */
import { useId, useState } from "react";
import { useForm, type Resolver } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { controlClasses, Field } from "@/components/ui/field";
import { Button, type ButtonVariant } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";
import { applyServerFieldErrors, describeError } from "@/lib/forms";

interface NoteActionFormProps {
  /** A shared schema with one text field (reportProblemInput, disposeInput…). */
  schema: z.ZodType;
  field: string;
  label: string;
  hint?: string;
  submitLabel: string;
  variant?: ButtonVariant;
  testId: string;
  onSubmit: (note: string) => Promise<unknown>;
  done?: string;
}

export function NoteActionForm({ schema, field, label, hint, submitLabel, variant = "secondary", testId, onSubmit, done }: NoteActionFormProps) {
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
