import type { Guard } from '../../../../shared/sheet/guards';
import type { LengthUnit } from '../../../../shared/units';
import { formatLength } from '../../../../shared/units';

const TEXT = (g: Guard, unit: LengthUnit, minGap: number, name: (id: string) => string) => {
  switch (g.kind) {
    case 'too-close':
      return `${name(g.pieceIds[0])} and ${name(g.pieceIds[1])} are ${formatLength(g.distanceMm, unit)} apart; the cutter needs ${formatLength(minGap, unit)}.`;
    case 'outside-print-area':
      return `${name(g.pieceIds[0])} goes past the print area: the cutter cannot cut there.`;
    case 'outside-safe-margin':
      return `${name(g.pieceIds[0])} is inside the safe margin.`;
    case 'low-resolution':
      return `${name(g.pieceIds[0])} prints at ${Math.round(g.dpi)} DPI (${g.severity === 'warning' ? 'under 150 looks soft' : '300 is ideal'}).`;
  }
};

/** The live checks of the sheet; choosing one selects its pieces. */
export function GuardsPanel({ guards, unit, minGap, name, onSelect }: { guards: Guard[]; unit: LengthUnit; minGap: number; name: (id: string) => string; onSelect: (ids: string[]) => void }) {
  if (guards.length === 0) return <p className="text-sm text-sage-deep" data-testid="guards-ok">No problems found.</p>;
  return (
    <ul className="flex flex-col gap-1" data-testid="guards">
      {guards.map((g, i) => (
        <li key={`${g.kind}-${g.pieceIds.join('-')}-${i}`}>
          <button
            type="button"
            onClick={() => onSelect([...g.pieceIds])}
            className={`w-full rounded-lg border-l-4 px-2 py-1 text-left text-xs ${g.severity === 'error' ? 'border-alarm bg-alarm-light' : g.severity === 'warning' ? 'border-peel bg-peel-light' : 'border-sage bg-sage-light'}`}
          >
            {TEXT(g, unit, minGap, name)}
          </button>
        </li>
      ))}
    </ul>
  );
}
