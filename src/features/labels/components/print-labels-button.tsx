/**
 * "Print labels" for a selection of containers or instruments: choose the label stock (a roll of
 * single labels by default) and the positions already used on the first sheet, then open the
 * PDF in a new tab. Shown to the manager and the safety officer, who may print labels.
 */
import { useState } from "react";
import { MAX_LABELS_PER_REQUEST } from "@shared/domain/labels";
import { buttonClasses } from "@/components/ui/button";
import { Select, Input } from "@/components/ui/input";
import { labelsPdfHref, useLabelStocks } from "../api/get-label-stocks";

interface PrintLabelsButtonProps {
  containerIds?: number[];
  instrumentIds?: number[];
  label?: string;
}

export function PrintLabelsButton({ containerIds = [], instrumentIds = [], label = "Print labels" }: PrintLabelsButtonProps) {
  const [open, setOpen] = useState(false);
  const stocks = useLabelStocks(open);
  const [stockId, setStockId] = useState("");
  const [skip, setSkip] = useState(0);
  const count = containerIds.length + instrumentIds.length;
  const sheet = stocks.data?.find((s) => String(s.id) === stockId);
  if (count === 0) return null;
  if (count > MAX_LABELS_PER_REQUEST) {
    return <span className="text-xs text-grey-600">Select at most {MAX_LABELS_PER_REQUEST} to print labels.</span>;
  }
  const href = labelsPdfHref({ containerIds, instrumentIds, stockId: stockId ? Number(stockId) : null, skip });
  return (
    <div className="flex flex-wrap items-end gap-2">
      {open && (
        <>
          <Select label="Label stock" value={stockId} onChange={(e) => setStockId(e.target.value)} data-testid="print-stock">
            <option value="">Single labels (roll)</option>
            {stocks.data?.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </Select>
          {sheet && sheet.columns * sheet.rows > 1 && (
            <Input
              label="Positions already used"
              type="number"
              min={0}
              max={sheet.columns * sheet.rows - 1}
              value={skip}
              onChange={(e) => setSkip(Math.max(0, Number(e.target.value) || 0))}
              fieldClassName="w-40"
            />
          )}
        </>
      )}
      {open ? (
        <a className={buttonClasses("primary")} href={href} target="_blank" rel="noopener" data-testid="print-labels-open">
          Open the PDF ({count} label{count === 1 ? "" : "s"})
        </a>
      ) : (
        <button type="button" className={buttonClasses("secondary")} onClick={() => setOpen(true)} data-testid="print-labels">
          {label}
        </button>
      )}
    </div>
  );
}
