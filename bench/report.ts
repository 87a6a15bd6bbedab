/**
 * The bench's table: every figure, its goal and whether it was met; with BENCH_SCALE, every
 * figure at 1× beside the same figure at the larger scale, the growth factor, and the growth goal
 * (at most GROWTH_GOAL× worse, where the issue asks a figure to hold as the facility grows).
 */

/** One measured figure of one run. */
export interface Figure {
  /** Stable across scales, to pair a 1× figure with its 10× one. */
  key: string;
  area: string;
  scenario: string;
  figure: string;
  /** The number compared across scales: req/s as a ratio to the signed-in baseline, else ms or MB. */
  value: number;
  text: string;
  /** Which way is better, for the growth factor; null for reference rows. */
  better: "higher" | "lower" | null;
  /** The absolute goal at this scale, if any. */
  goal?: { text: string; ok: boolean };
  /** Held to GROWTH_GOAL when scaled (false for figures that must grow with the data, like the billing run). */
  holds: boolean;
}

/** At the larger scale a figure that must hold may be at most this many times worse than at 1×. */
export const GROWTH_GOAL = 1.5;

export const fmt = (n: number) => Math.round(n).toLocaleString("en");

function print(head: string[], rows: string[][]): void {
  const width = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const line = (cells: string[]) => `| ${cells.map((c, i) => c.padEnd(width[i])).join(" | ")} |`;
  console.log(line(head));
  console.log(`| ${width.map((w) => "-".repeat(w)).join(" | ")} |`);
  for (const r of rows) console.log(line(r));
}

/** One run's table. */
export function printSingle(figures: Figure[]): void {
  print(
    ["area", "scenario", "figure", "measured", "goal", "met"],
    figures.map((f) => [f.area, f.scenario, f.figure, f.text, f.goal?.text ?? "", f.goal ? (f.goal.ok ? "met" : "not met") : ""]),
  );
}

/** How many times worse the scaled figure is (1.0 = the same; below 1 = better). */
export function growth(one: Figure, scaled: Figure): number | null {
  if (!one.better || one.value <= 0 || scaled.value <= 0) return null;
  return one.better === "higher" ? one.value / scaled.value : scaled.value / one.value;
}

/** The 1× run beside the scaled one. */
export function printScaled(scale: number, one: Figure[], scaled: Figure[]): void {
  const rows: string[][] = [];
  for (const s of scaled) {
    const o = one.find((f) => f.key === s.key);
    const g = o ? growth(o, s) : null;
    const holds = s.holds && s.better !== null;
    const goals = [s.goal?.text, holds ? `≤ ${GROWTH_GOAL} × 1×` : undefined].filter(Boolean).join("; ");
    const ok = (s.goal ? s.goal.ok : true) && (!holds || (g !== null && g <= GROWTH_GOAL));
    const mark = (f?: Figure) => (f?.goal ? (f.goal.ok ? " ✓" : " ✗") : "");
    rows.push([
      s.area,
      s.scenario,
      s.figure,
      o ? `${o.text}${mark(o)}` : "",
      `${s.text}${mark(s)}`,
      g === null ? "" : `${g.toFixed(2)} ×`,
      goals,
      goals ? (ok ? "met" : "not met") : "",
    ]);
  }
  print(["area", "scenario", "figure", "1×", `${scale}×`, `growth (${scale}× vs 1×)`, `goal at ${scale}×`, "met"], rows);
  console.log(`\nGrowth: how many times worse the ${scale}× figure is than the 1× one (throughput compares the ratios to the signed-in baseline of each run).`);
}
