/** Text inputs, selects and checkboxes, each with its label and error text; they take react-hook-form's register() spread. */
import { useId, type InputHTMLAttributes, type ReactNode, type Ref, type SelectHTMLAttributes } from "react";
import { cn } from "@/lib/cn";
import { controlClasses, describedBy, Field } from "./field";

interface InputProps extends InputHTMLAttributes<HTMLInputElement> {
  label: ReactNode;
  error?: string;
  hint?: ReactNode;
  ref?: Ref<HTMLInputElement>;
  fieldClassName?: string;
}

export function Input({ label, error, hint, id, className, fieldClassName, required, ref, ...props }: InputProps) {
  const autoId = useId();
  const inputId = id ?? autoId;
  return (
    <Field id={inputId} label={label} hint={hint} error={error} required={required} className={fieldClassName}>
      <input
        ref={ref}
        id={inputId}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(inputId, hint, error)}
        aria-required={required || undefined}
        className={controlClasses(Boolean(error), cn("h-8", className))}
        {...props}
      />
    </Field>
  );
}

interface SelectProps extends SelectHTMLAttributes<HTMLSelectElement> {
  label: ReactNode;
  error?: string;
  hint?: ReactNode;
  ref?: Ref<HTMLSelectElement>;
  fieldClassName?: string;
  children: ReactNode;
}

export function Select({ label, error, hint, id, className, fieldClassName, required, ref, children, ...props }: SelectProps) {
  const autoId = useId();
  const selectId = id ?? autoId;
  return (
    <Field id={selectId} label={label} hint={hint} error={error} required={required} className={fieldClassName}>
      <select
        ref={ref}
        id={selectId}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(selectId, hint, error)}
        className={controlClasses(Boolean(error), cn("h-8 pr-8", className))}
        {...props}
      >
        {children}
      </select>
    </Field>
  );
}

interface CheckboxProps extends Omit<InputHTMLAttributes<HTMLInputElement>, "type"> {
  label: ReactNode;
  ref?: Ref<HTMLInputElement>;
}

export function Checkbox({ label, id, className, ref, ...props }: CheckboxProps) {
  const autoId = useId();
  const boxId = id ?? autoId;
  return (
    <div className={cn("flex items-center gap-2", className)}>
      <input
        ref={ref}
        id={boxId}
        type="checkbox"
        className="size-4 rounded border-grey-400 accent-aqueous-700 focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-aqueous-600"
        {...props}
      />
      <label htmlFor={boxId} className="text-sm text-grey-800">
        {label}
      </label>
    </div>
  );
}
