/**
 * The frame around a form control: label, the control, a hint and the error in words. Inputs and
 * selects use it; custom controls (checkbox groups) use FieldSet. Errors are tied to the control
 * with aria-describedby and aria-invalid so screen readers announce them.
 */
import type { ReactNode } from "react";
import { cn } from "@/lib/cn";

/** The ids of what is shown under a control: the error in place of the hint once there is one. */
export function describedBy(id: string, hint?: ReactNode, error?: string): string | undefined {
  const ids = [hint && !error ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean);
  return ids.length ? ids.join(" ") : undefined;
}

interface FieldProps {
  id: string;
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  required?: boolean;
  className?: string;
  children: ReactNode;
}

export function Field({ id, label, hint, error, required, className, children }: FieldProps) {
  return (
    <div className={cn("flex flex-col gap-1", className)}>
      <label htmlFor={id} className="text-xs font-medium text-grey-700">
        {label}
        {required && (
          <span className="ml-0.5 text-danger-700" aria-hidden="true">
            *
          </span>
        )}
      </label>
      {children}
      <HintOrError id={id} hint={hint} error={error} />
    </div>
  );
}

/** Under a control: the hint, or the error in its place once there is one (ids match describedBy). */
function HintOrError({ id, hint, error }: { id: string; hint?: ReactNode; error?: string }) {
  return (
    <>
      {hint && !error && (
        <p id={`${id}-hint`} className="text-xs text-grey-600">
          {hint}
        </p>
      )}
      <FieldError id={`${id}-error`} message={error} />
    </>
  );
}

export function FieldError({ id, message }: { id?: string; message?: string }) {
  if (!message) return null;
  return (
    <p id={id} className="flex items-start gap-1 text-xs font-medium text-danger-700">
      <svg viewBox="0 0 16 16" className="mt-0.5 size-3 shrink-0" fill="currentColor" aria-hidden="true">
        <path d="M8 1.5a6.5 6.5 0 1 0 0 13 6.5 6.5 0 0 0 0-13ZM7.25 4.5h1.5v4.5h-1.5Zm0 5.75h1.5v1.5h-1.5Z" />
      </svg>
      <span>{message}</span>
    </p>
  );
}

interface FieldSetProps {
  legend: ReactNode;
  hint?: ReactNode;
  error?: string;
  id: string;
  className?: string;
  children: ReactNode;
}

/** A group of related controls (checkboxes, radios) with one legend and one error line. */
export function FieldSet({ legend, hint, error, id, className, children }: FieldSetProps) {
  return (
    <fieldset
      className={cn("flex flex-col gap-1", className)}
      aria-describedby={describedBy(id, hint, error)}
      aria-invalid={error ? true : undefined}
    >
      <legend className="mb-1 text-xs font-medium text-grey-700">{legend}</legend>
      {children}
      <HintOrError id={id} hint={hint} error={error} />
    </fieldset>
  );
}

export const controlClasses = (invalid: boolean, className?: string) =>
  cn(
    "block w-full rounded-md border bg-white px-2.5 text-sm text-grey-900 shadow-xs placeholder:text-grey-400",
    "focus-visible:outline-2 focus-visible:outline-offset-0",
    "disabled:cursor-not-allowed disabled:bg-grey-100 disabled:text-grey-500",
    invalid
      ? "border-danger-600 focus-visible:outline-danger-600"
      : "border-grey-300 hover:border-grey-400 focus-visible:border-aqueous-600 focus-visible:outline-aqueous-600",
    className,
  );
