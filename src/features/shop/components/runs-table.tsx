import { RUN_RESULT_LABELS } from '@shared/schemas/shop';
import type { PrintRunView } from '@shared/schemas/shop';
import { cutterSettingsText, printerSettingsText } from '../settings-text';

/** The logged runs, newest first: what was printed on which stock and cutter, and how it went. */
export function RunsTable({ runs }: { runs: PrintRunView[] }) {
  return (
    <table className="w-full text-xs [&_td]:pr-3 [&_th]:pr-3" data-testid="runs-table">
      <thead className="text-left text-ink-soft">
        <tr>
          <th>Date</th>
          <th>Sheet</th>
          <th>Copies</th>
          <th>Wasted</th>
          <th>Stock</th>
          <th>Cutter / blade</th>
          <th>Cut</th>
          <th>Result</th>
          <th>Notes</th>
          <th>By</th>
        </tr>
      </thead>
      <tbody>
        {runs.map((r) => (
          <tr key={r.id} className="border-t border-paper-deep">
            <td className="whitespace-nowrap py-1">{r.printedOn}</td>
            <td>
              {r.sheet.name} <span className="text-ink-faint">v{r.sheet.version}</span>
            </td>
            <td>{r.copies}</td>
            <td>{r.wasted}</td>
            <td>{r.stock?.name ?? '—'}</td>
            <td>{r.cutter ? `${r.cutter.name}${r.blade ? ` / ${r.blade.label}` : ''}` : '—'}</td>
            <td className="whitespace-nowrap">{r.cutLengthM.toFixed(2)} m</td>
            <td className={r.result === 'good' ? 'text-sage-deep' : 'font-bold text-alarm'}>{RUN_RESULT_LABELS[r.result]}</td>
            <td>
              {r.notes}
              {r.photoUrl && (
                <>
                  {' '}
                  <a href={r.photoUrl} className="underline" target="_blank" rel="noreferrer">
                    photo
                  </a>
                </>
              )}
              <details>
                <summary className="cursor-pointer text-ink-faint">settings</summary>
                {[printerSettingsText(r.printerSettings), cutterSettingsText(r.cutterSettings)].filter(Boolean).join(' · ')}
              </details>
            </td>
            <td>{r.by}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
