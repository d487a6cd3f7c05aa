import type { Finding } from '@shared/sheet/preflight';
import { countBySeverity } from '@shared/sheet/preflight';

const TONE = { error: 'border-alarm bg-alarm-light', warning: 'border-peel bg-peel-light', notice: 'border-sage bg-sage-light' } as const;
const LABEL = { error: 'Error', warning: 'Warning', notice: 'Note' } as const;

/** Preflight: what would waste a sheet of sticker paper, worst first; choosing a finding selects its pieces. */
export function PreflightPanel({ findings, onSelect }: { findings: Finding[]; onSelect: (ids: string[]) => void }) {
  if (findings.length === 0)
    return (
      <p className="text-sm text-sage-deep" data-testid="preflight-ok">
        Ready to print: no problems found.
      </p>
    );
  const n = countBySeverity(findings);
  return (
    <div data-testid="preflight">
      <p className="mb-1 text-xs font-bold" data-testid="preflight-counts">
        {n.error} error{n.error === 1 ? '' : 's'} · {n.warning} warning{n.warning === 1 ? '' : 's'} · {n.notice} note
        {n.notice === 1 ? '' : 's'}
      </p>
      <ul className="flex flex-col gap-1">
        {findings.map((f, i) => (
          <li key={`${f.code}-${f.pieceIds.join('-')}-${i}`}>
            <button
              type="button"
              onClick={() => onSelect([...f.pieceIds])}
              data-code={f.code}
              className={`w-full rounded-lg border-l-4 px-2 py-1 text-left text-xs ${TONE[f.severity]}`}
            >
              <span className="font-extrabold">{LABEL[f.severity]}: </span>
              {f.message}
            </button>
          </li>
        ))}
      </ul>
    </div>
  );
}
