/**
 * Asking before an action that cannot be undone, in our own dialog rather than the browser's
 * confirm box: `const [confirmation, confirm] = useConfirm();` render `confirmation` once, then
 * `if (!(await confirm({ title, confirmLabel }))) return;`.
 */
import { useCallback, useRef, useState, type ReactNode } from "react";
import { Button } from "./button";
import { Dialog } from "./dialog";

export interface ConfirmOptions {
  title: string;
  description?: ReactNode;
  /** The action's own words, e.g. "Cancel the booking"; never a bare "OK". */
  confirmLabel: string;
  /** What keeping things as they are is called, e.g. "Keep it". */
  keepLabel?: string;
  tone?: "danger" | "primary";
}

export function useConfirm(): [ReactNode, (options: ConfirmOptions) => Promise<boolean>] {
  const [asking, setAsking] = useState<ConfirmOptions | null>(null);
  const resolver = useRef<((answer: boolean) => void) | null>(null);

  const settle = useCallback((answer: boolean) => {
    resolver.current?.(answer);
    resolver.current = null;
    setAsking(null);
  }, []);

  const confirm = useCallback((options: ConfirmOptions) => {
    // A second question replaces an unanswered first one, which counts as "no".
    resolver.current?.(false);
    setAsking(options);
    return new Promise<boolean>((resolve) => {
      resolver.current = resolve;
    });
  }, []);

  const element = (
    <Dialog open={asking !== null} onClose={() => settle(false)} title={asking?.title ?? ""} description={asking?.description}>
      <div className="flex justify-end gap-2" data-testid="confirm-dialog">
        <Button onClick={() => settle(false)} data-testid="confirm-dialog-keep">
          {asking?.keepLabel ?? "Go back"}
        </Button>
        <Button variant={asking?.tone ?? "danger"} onClick={() => settle(true)} data-testid="confirm-dialog-go" autoFocus>
          {asking?.confirmLabel}
        </Button>
      </div>
    </Dialog>
  );
  return [element, confirm];
}
