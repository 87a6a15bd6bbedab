/** Buttons: one primary action per view in the aqueous accent, the rest quiet. */
import type { ButtonHTMLAttributes, Ref } from "react";
import { cn } from "@/lib/cn";
import { Spinner } from "./spinner";

export type ButtonVariant = "primary" | "secondary" | "danger" | "ghost";
export type ButtonSize = "sm" | "md";

const VARIANTS: Record<ButtonVariant, string> = {
  primary: "bg-aqueous-700 text-white shadow-xs hover:bg-aqueous-800 active:bg-aqueous-900",
  secondary: "border border-grey-300 bg-white text-grey-800 shadow-xs hover:bg-grey-50 active:bg-grey-100",
  danger: "bg-danger-700 text-white shadow-xs hover:bg-danger-800",
  ghost: "text-grey-700 hover:bg-grey-200/60 hover:text-grey-900",
};

const SIZES: Record<ButtonSize, string> = {
  sm: "h-7 px-2.5 text-xs",
  md: "h-8 px-3 text-sm",
};

/** The same look for a <Link> that acts as a button. */
export function buttonClasses(variant: ButtonVariant = "secondary", size: ButtonSize = "md", className?: string): string {
  return cn(
    "inline-flex shrink-0 items-center justify-center gap-1.5 rounded-md font-medium no-underline transition-colors",
    "focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-aqueous-600",
    "disabled:cursor-not-allowed disabled:opacity-60",
    VARIANTS[variant],
    SIZES[size],
    className,
  );
}

export interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: ButtonVariant;
  size?: ButtonSize;
  /** Shows a spinner and blocks a second click while a request runs. */
  loading?: boolean;
  ref?: Ref<HTMLButtonElement>;
}

export function Button({
  variant = "secondary",
  size = "md",
  loading = false,
  type = "button",
  disabled,
  className,
  children,
  ref,
  ...props
}: ButtonProps) {
  return (
    <button
      ref={ref}
      type={type}
      disabled={disabled || loading}
      aria-busy={loading || undefined}
      className={buttonClasses(variant, size, className)}
      {...props}
    >
      {loading && <Spinner size="sm" className={variant === "primary" || variant === "danger" ? "text-white" : undefined} />}
      {children}
    </button>
  );
}
