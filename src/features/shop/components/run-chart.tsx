import type { PrintRunView } from '@shared/schemas/shop';

/** Cut length and wasted sheets per week, as bars: what the blade has been through and what went in the bin. */
export function RunChart({ runs }: { runs: PrintRunView[] }) {
  const weeks = new Map<string, { cut: number; wasted: number }>();
  for (const r of runs) {
    const d = new Date(`${r.printedOn}T00:00:00Z`);
    d.setUTCDate(d.getUTCDate() - ((d.getUTCDay() + 6) % 7)); // the Monday of its week
    const key = d.toISOString().slice(0, 10);
    const w = weeks.get(key) ?? { cut: 0, wasted: 0 };
    weeks.set(key, { cut: w.cut + r.cutLengthM, wasted: w.wasted + r.wasted });
  }
  const rows = [...weeks].sort(([a], [b]) => a.localeCompare(b)).slice(-12);
  if (rows.length === 0) return null;
  const maxCut = Math.max(...rows.map(([, w]) => w.cut), 0.001),
    maxWaste = Math.max(...rows.map(([, w]) => w.wasted), 1);
  const bar = 40,
    h = 90;
  return (
    <figure className="mb-3" aria-label="Cut length and wasted sheets by week">
      <svg
        width={rows.length * bar + 10}
        height={h + 30}
        role="img"
        aria-label={`Bars for ${rows.length} week${rows.length === 1 ? '' : 's'}: metres cut and sheets wasted`}
        data-testid="run-chart"
      >
        {rows.map(([week, w], i) => (
          <g key={week} transform={`translate(${5 + i * bar},0)`}>
            <rect x={4} y={h - (h * w.cut) / maxCut} width={14} height={(h * w.cut) / maxCut} className="fill-sage">
              <title>{`${week}: ${w.cut.toFixed(1)} m cut`}</title>
            </rect>
            <rect x={20} y={h - (h * w.wasted) / maxWaste} width={14} height={(h * w.wasted) / maxWaste} className="fill-alarm">
              <title>{`${week}: ${w.wasted} sheets wasted`}</title>
            </rect>
            <text x={2} y={h + 14} fontSize={9}>
              {week.slice(5)}
            </text>
          </g>
        ))}
      </svg>
      <figcaption className="text-xs text-ink-soft">
        <span className="text-sage-deep">■</span> metres cut · <span className="text-alarm">■</span> sheets wasted, per week (up to{' '}
        {maxCut.toFixed(1)} m and {maxWaste} sheets)
      </figcaption>
    </figure>
  );
}
