/** One figure on a start page, with a word about whether it needs attention and a link to act on it. */
import { Link } from "react-router-dom";
import { Badge, type BadgeTone } from "@/components/ui/badge";

interface StatTileProps {
  label: string;
  value: number;
  to: string;
  linkText: string;
  /** How a non-zero value should read; zero always reads "None". */
  attention?: { tone: BadgeTone; word: string };
  testId?: string;
}

export function StatTile({ label, value, to, linkText, attention, testId }: StatTileProps) {
  return (
    <div className="flex flex-col gap-1 rounded-lg border border-grey-200 bg-white px-4 py-3 shadow-xs" data-testid={testId}>
      <div className="flex items-start justify-between gap-2">
        <p className="text-xs font-medium text-grey-600">{label}</p>
        {value > 0 && attention ? <Badge tone={attention.tone}>{attention.word}</Badge> : <Badge tone="neutral">None</Badge>}
      </div>
      <p className="text-2xl font-semibold tabular-nums text-grey-900">{value}</p>
      <Link to={to} className="text-xs">
        {linkText}
      </Link>
    </div>
  );
}
