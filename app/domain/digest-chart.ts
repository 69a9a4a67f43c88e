// The digest's chart of write-ups per system: a horizontal bar chart laid out here, drawn as SVG by
// app/components/digest-document.tsx. Pure geometry, in SVG user units.

export type ChartRow = { label: string; count: number };

export type BarChart = {
  width: number;
  height: number;
  labelWidth: number;
  bars: { label: string; count: number; y: number; barWidth: number; textY: number }[];
  /** Vertical grid lines at whole numbers of write-ups. */
  ticks: { value: number; x: number }[];
  barHeight: number;
  /** Where the bars start (after the labels). */
  plotX: number;
  plotWidth: number;
};

/** A "nice" step for grid lines: 1, 2 or 5 times a power of ten, giving at most `maxTicks` lines. */
export function niceStep(max: number, maxTicks = 5): number {
  if (max <= 0) return 1;
  const raw = max / maxTicks;
  const power = 10 ** Math.floor(Math.log10(raw));
  for (const m of [1, 2, 5, 10]) {
    const step = m * power;
    if (step >= raw) return Math.max(1, step);
  }
  return Math.max(1, 10 * power);
}

/**
 * Lays out one bar per row, in the order given, scaled so that the longest bar fills the plot.
 * Rows with a count of zero keep their place (a bar of no width) so that every system shows.
 */
export function layoutBarChart(
  rows: readonly ChartRow[],
  options: { width?: number; labelWidth?: number; barHeight?: number; gap?: number; countWidth?: number } = {},
): BarChart {
  const width = options.width ?? 640;
  const labelWidth = options.labelWidth ?? 170;
  const barHeight = options.barHeight ?? 18;
  const gap = options.gap ?? 8;
  const countWidth = options.countWidth ?? 36;
  const top = 6;
  const plotX = labelWidth;
  const plotWidth = Math.max(10, width - labelWidth - countWidth);
  const max = Math.max(0, ...rows.map((r) => r.count));
  const step = niceStep(max);
  const scaleMax = max === 0 ? 1 : Math.ceil(max / step) * step;
  const bars = rows.map((r, i) => {
    const y = top + i * (barHeight + gap);
    return { label: r.label, count: r.count, y, barWidth: (Math.max(0, r.count) / scaleMax) * plotWidth, textY: y + barHeight * 0.72 };
  });
  const ticks: { value: number; x: number }[] = [];
  for (let v = 0; v <= scaleMax + 1e-9; v += step) ticks.push({ value: v, x: plotX + (v / scaleMax) * plotWidth });
  const height = top + rows.length * (barHeight + gap) - gap + 22;
  return { width, height: Math.max(height, 40), labelWidth, bars, ticks, barHeight, plotX, plotWidth };
}
