/**
 * A modal built on the native <dialog> opened with showModal(): the rest of the page becomes
 * inert (Tab stays inside the dialog), Escape closes it, focus goes to the first control (or the
 * one marked autoFocus) and comes back to where it was afterwards, so no extra library is
 * needed. A close button in the corner (last in the Tab order, so the dialog opens on its first
 * field) serves pointer and keyboard users alike.
 */
import { useEffect, useId, useRef, type ReactNode } from "react";
import { cn } from "@/lib/cn";

interface DialogProps {
  open: boolean;
  onClose: () => void;
  title: string;
  description?: ReactNode;
  children: ReactNode;
  className?: string;
}

export function Dialog({ open, onClose, title, description, children, className }: DialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) dialog.showModal();
    if (!open && dialog.open) dialog.close();
  }, [open]);

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      onClose={onClose}
      onCancel={(e) => {
        e.preventDefault();
        onClose();
      }}
      className={cn(
        "m-auto w-[min(32rem,calc(100vw-2rem))] rounded-lg border border-grey-200 bg-white p-0 text-grey-900 shadow-xl backdrop:bg-black/50",
        className,
      )}
    >
      {open && (
        <div className="relative flex flex-col gap-3 p-4">
          <div className="pr-8">
            <div className="min-w-0">
              <h2 id={titleId} className="text-base font-semibold">
                {title}
              </h2>
              {description && <div className="mt-1 text-grey-600">{description}</div>}
            </div>
          </div>
          {children}
          <button
            type="button"
            onClick={onClose}
            className="absolute right-3 top-3 inline-flex size-7 shrink-0 items-center justify-center rounded-md text-grey-600 hover:bg-grey-100 hover:text-grey-900"
            data-testid="dialog-close"
          >
            <span className="sr-only">Close</span>
            <svg viewBox="0 0 16 16" className="size-4" fill="none" stroke="currentColor" strokeWidth="1.6" aria-hidden="true">
              <path d="M4 4l8 8M12 4 4 12" />
            </svg>
          </button>
        </div>
      )}
    </dialog>
  );
}
