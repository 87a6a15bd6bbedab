/**
 * The plan as a picture: the Galvani potential axis with the polarisable window shaded, the
 * region beyond each edge in the colour of the phase whose ion transfers there (aqueous teal,
 * organic ochre: the theme's two phase colours), each edge labelled by its ion, each analyte's
 * transfer marked, and below it the simulated reversible voltammogram of each analyte. Drawn by
 * hand as SVG; the caption says the same in words and the table beside it gives the numbers.
 */
import type { RunPlanPreviewDto } from "@shared/schemas/run-plans";
import { formatCurrent, formatVolts, phaseWord, prettyIon } from "./format";

const W = 600;
const PAD = 52;
const AXIS_H = 150;
const PLOT_H = 150;

type Phase = "aqueous" | "organic";

const PHASE_CLASSES: Record<Phase, { band: string; line: string; text: string }> = {
  aqueous: { band: "fill-aqueous-100", line: "stroke-aqueous-600", text: "fill-aqueous-800" },
  organic: { band: "fill-organic-100", line: "stroke-organic-600", text: "fill-organic-800" },
};

function niceStep(span: number): number {
  return span > 1.6 ? 0.4 : span > 0.8 ? 0.2 : span > 0.4 ? 0.1 : 0.05;
}

/** The potential range shown: the window's edges, the analytes and their scans, with a margin. */
function potentialRange(p: RunPlanPreviewDto): [number, number] {
  const values: number[] = [];
  for (const e of p.window.edges) if (e.limiting) values.push(e.edgeV);
  for (const a of p.analytes) {
    values.push(a.halfWavePotentialV);
    for (const pt of a.voltammogram ?? []) values.push(pt.potentialV);
  }
  if (values.length === 0) return [-0.8, 0.8];
  const lo = Math.min(...values) - 0.12;
  const hi = Math.max(...values) + 0.12;
  const step = niceStep(hi - lo);
  return [Math.floor(lo / step) * step, Math.ceil(hi / step) * step];
}

/** The sentence the picture says, for screen readers and anyone who prefers words. */
export function describeWindow(p: RunPlanPreviewDto): string {
  const w = p.window;
  const edge = (side: "negative" | "positive") => {
    const e = w.edges.find((x) => x.limiting && x.side === side);
    return e ? `${formatVolts(e.edgeV)} (set by ${prettyIon(e.ion)} from the ${phaseWord(e.phase)} phase)` : "open (no listed ion can set it)";
  };
  const parts = [`The window runs from ${edge("negative")} to ${edge("positive")}${w.widthV !== null ? `, ${(w.widthV * 1000).toFixed(0)} mV wide` : ""}.`];
  for (const a of p.analytes) {
    const where = a.insideWindow === true ? "inside the window" : a.insideWindow === false ? "outside the window" : "where the window cannot say";
    const current = a.peakCurrentA !== null ? `, peak ${formatCurrent(a.peakCurrentA)}` : a.steadyStateCurrentA !== null ? `, steady state ${formatCurrent(a.steadyStateCurrentA)}` : "";
    parts.push(`${prettyIon(a.ion)} from the ${phaseWord(a.phase)} phase transfers at ${formatVolts(a.halfWavePotentialV)}, ${where}${current}.`);
  }
  return parts.join(" ");
}

export function PotentialPicture({ preview, solventName }: { preview: RunPlanPreviewDto; solventName: string }) {
  const [lo, hi] = potentialRange(preview);
  const x = (v: number) => PAD + ((v - lo) / (hi - lo)) * (W - 2 * PAD);
  const step = niceStep(hi - lo);
  const ticks: number[] = [];
  for (let v = lo; v <= hi + 1e-9; v += step) ticks.push(Math.round(v / step) * step);
  const w = preview.window;
  const neg = w.edges.find((e) => e.limiting && e.side === "negative") ?? null;
  const pos = w.edges.find((e) => e.limiting && e.side === "positive") ?? null;
  const plotted = preview.analytes.filter((a) => (a.voltammogram?.length ?? 0) > 1);
  const height = AXIS_H + plotted.length * PLOT_H + 10;
  const axisY = 96;
  const desc = describeWindow(preview);

  return (
    <figure className="flex flex-col gap-2" data-testid="run-plan-picture">
      <div className="overflow-x-auto">
      <svg viewBox={`0 0 ${W} ${height}`} className="h-auto w-full min-w-[30rem] max-w-3xl" role="img" aria-labelledby="run-plan-picture-title run-plan-picture-desc">
        <title id="run-plan-picture-title">Potential window and ion transfers at water | {solventName}</title>
        <desc id="run-plan-picture-desc">{desc}</desc>
        {/* Beyond each edge: the limiting ion's phase colour. */}
        <rect x={PAD} y={30} width={Math.max(0, (neg ? x(neg.edgeV) : PAD) - PAD)} height={axisY - 30} className={neg ? PHASE_CLASSES[neg.phase].band : "fill-grey-100"} />
        <rect x={pos ? x(pos.edgeV) : W - PAD} y={30} width={Math.max(0, W - PAD - (pos ? x(pos.edgeV) : W - PAD))} height={axisY - 30} className={pos ? PHASE_CLASSES[pos.phase].band : "fill-grey-100"} />
        {/* The window. */}
        <rect x={neg ? x(neg.edgeV) : PAD} y={30} width={Math.max(0, (pos ? x(pos.edgeV) : W - PAD) - (neg ? x(neg.edgeV) : PAD))} height={axisY - 30} className="fill-white stroke-grey-300" strokeDasharray="4 3" />
        {w.widthV !== null && neg && pos && (
          <text x={(x(neg.edgeV) + x(pos.edgeV)) / 2} y={46} textAnchor="middle" className="fill-grey-700 text-[13px]">
            window {(w.widthV * 1000).toFixed(0)} mV
          </text>
        )}
        {[neg, pos].map((e) =>
          e ? (
            <g key={e.side} data-testid={`edge-${e.side}`}>
              <line x1={x(e.edgeV)} x2={x(e.edgeV)} y1={24} y2={axisY} className={PHASE_CLASSES[e.phase].line} strokeWidth={2} />
              <text x={x(e.edgeV) + (e.side === "negative" ? -4 : 4)} y={20} textAnchor={e.side === "negative" ? "end" : "start"} className={`${PHASE_CLASSES[e.phase].text} text-[13px] font-semibold`}>
                {prettyIon(e.ion)} {formatVolts(e.edgeV)}
              </text>
            </g>
          ) : null,
        )}
        {/* Analytes' transfers on the axis. */}
        {preview.analytes.map((a, i) => (
          <g key={`${a.ion}-${i}`}>
            <path d={`M ${x(a.halfWavePotentialV)} ${axisY - 2} l -6 -12 h 12 z`} className={`${PHASE_CLASSES[a.phase].line} ${a.insideWindow === false ? "fill-danger-400" : "fill-grey-800"}`} />
            <text x={x(a.halfWavePotentialV)} y={axisY - 20 - (i % 2) * 13} textAnchor="middle" className="fill-grey-900 text-[12px]">
              {prettyIon(a.ion)}
            </text>
          </g>
        ))}
        {/* The axis. */}
        <line x1={PAD} x2={W - PAD} y1={axisY} y2={axisY} className="stroke-grey-700" />
        {ticks.map((v) => (
          <g key={v}>
            <line x1={x(v)} x2={x(v)} y1={axisY} y2={axisY + 5} className="stroke-grey-700" />
            <text x={x(v)} y={axisY + 18} textAnchor="middle" className="fill-grey-700 text-[12px]">
              {v.toFixed(step < 0.1 ? 2 : 1)}
            </text>
          </g>
        ))}
        <text x={W / 2} y={axisY + 36} textAnchor="middle" className="fill-grey-800 text-[13px]">
          Δ
          <tspan baselineShift="sub" fontSize="9">
            o
          </tspan>
          <tspan baselineShift="super" fontSize="9">
            w
          </tspan>
          φ / V (φ water − φ organic)
        </text>
        {plotted.map((a, k) => {
          const top = AXIS_H + k * PLOT_H + 10;
          const pts = a.voltammogram ?? [];
          const iMax = Math.max(...pts.map((p) => p.currentA));
          const iMin = Math.min(...pts.map((p) => p.currentA));
          const span = iMax - iMin || 1;
          const y = (i: number) => top + 14 + (1 - (i - iMin) / span) * (PLOT_H - 44);
          const d = pts.map((p, j) => `${j === 0 ? "M" : "L"} ${x(p.potentialV).toFixed(1)} ${y(p.currentA).toFixed(1)}`).join(" ");
          return (
            <g key={`cv-${a.ion}-${k}`} data-testid="voltammogram">
              <rect x={PAD} y={top} width={W - 2 * PAD} height={PLOT_H - 24} className="fill-grey-50 stroke-grey-200" />
              <line x1={PAD} x2={W - PAD} y1={y(0)} y2={y(0)} className="stroke-grey-300" strokeDasharray="2 3" />
              <path d={d} fill="none" className={PHASE_CLASSES[a.phase].line} strokeWidth={1.8} />
              <text x={PAD + 6} y={top + 14} className="fill-grey-800 text-[12px]">
                {prettyIon(a.ion)} from the {phaseWord(a.phase)} phase, simulated reversible CV{a.peakCurrentA !== null ? `: peak ${formatCurrent(a.peakCurrentA)}` : ""}
              </text>
              <text x={PAD - 6} y={y(iMax)} textAnchor="end" className="fill-grey-600 text-[11px]">
                {formatCurrent(iMax)}
              </text>
              <text x={PAD - 6} y={y(iMin)} textAnchor="end" className="fill-grey-600 text-[11px]">
                {formatCurrent(iMin)}
              </text>
            </g>
          );
        })}
      </svg>
      </div>
      <figcaption className="text-sm text-grey-700">
        <p>{desc}</p>
        <p className="mt-1 flex flex-wrap gap-3 text-xs">
          <span className="inline-flex items-center gap-1">
            <span className="inline-block h-3 w-3 rounded-sm border border-aqueous-600 bg-aqueous-100" aria-hidden /> beyond the edge an ion from the water transfers
          </span>
          <span className="inline-flex items-center gap-1">
            <span className="inline-block h-3 w-3 rounded-sm border border-organic-600 bg-organic-100" aria-hidden /> beyond the edge an ion from {solventName} transfers
          </span>
        </p>
      </figcaption>
    </figure>
  );
}
