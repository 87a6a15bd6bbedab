/**
 * A modal built on the native <dialog>: the browser traps focus, closes on Escape and restores
 * focus afterwards, so no extra library is needed.
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
        "m-auto w-[min(32rem,calc(100vw-2rem))] rounded-lg border border-grey-200 bg-white p-0 text-grey-900 shadow-xl backdrop:bg-grey-950/40",
        className,
      )}
    >
      {open && (
        <div className="flex flex-col gap-3 p-4">
          <div>
            <h2 id={titleId} className="text-base font-semibold">
              {title}
            </h2>
            {description && <div className="mt-1 text-grey-600">{description}</div>}
          </div>
          {children}
        </div>
      )}
    </dialog>
  );
}
