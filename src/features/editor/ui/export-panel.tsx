import { useQuery } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import type { ExportJobView } from '@shared/schemas/exports';
import { exportFileLabel } from '@shared/schemas/exports';
import { ApiError } from '@/lib/api-client';
import { cancelExport, getExport, latestExport, startExport } from '../api/exports';
import type { Finding } from '@shared/sheet/preflight';
import type { SheetDetail } from '@shared/schemas/sheets';
import { REG_MARK_LABELS } from '@shared/schemas/sheets';

/** Export settings, the running job's progress, and the bundle to download (kept per sheet version). */
export function ExportPanel({
  teamId,
  sheetId,
  unsaved,
  findings,
  areaText,
  printing,
  formatLength,
  onClose,
}: {
  teamId: string;
  sheetId: string;
  unsaved: boolean;
  findings: Finding[];
  areaText: string;
  printing: SheetDetail['printing'];
  formatLength: (mm: number) => string;
  onClose: () => void;
}) {
  const errors = findings.filter((f) => f.severity === 'error');
  const warnings = findings.filter((f) => f.severity === 'warning');
  const [acceptErrors, setAcceptErrors] = useState(false);
  const [dpi, setDpi] = useState(300);
  const [background, setBackground] = useState<'transparent' | 'white'>('transparent');
  const [bleed, setBleed] = useState(0);
  const [sheetCut, setSheetCut] = useState(false);
  const [checkBar, setCheckBar] = useState(true);
  const [marksInCutFile, setMarksInCutFile] = useState(false);
  const [job, setJob] = useState<ExportJobView | null>(null);
  const [error, setError] = useState<string | null>(null);
  const latest = useQuery({
    queryKey: ['teams', teamId, 'sheets', sheetId, 'export-latest'],
    queryFn: () => latestExport(teamId, sheetId),
  });

  useEffect(() => {
    if (!job || job.status !== 'running') return;
    const t = setTimeout(
      () =>
        void getExport(teamId, sheetId, job.id)
          .then(setJob)
          .catch(() => undefined),
      400,
    );
    return () => clearTimeout(t);
  }, [job, teamId, sheetId]);

  const start = async () => {
    setError(null);
    try {
      setJob(
        await startExport(teamId, sheetId, {
          dpi,
          background,
          bleedMm: bleed,
          sheetCut: sheetCut ? { marginMm: 1.5, radiusMm: 3 } : null,
          checkBar,
          marksInCutFile,
          acceptErrors,
        }),
      );
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'The export could not start.');
    }
  };
  const shown = job ?? latest.data?.export ?? null;
  const stop = async () => {
    if (!shown) return;
    try {
      setJob(await cancelExport(teamId, sheetId, shown.id));
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'The export could not be stopped.');
    }
  };

  return (
    <section
      role="dialog"
      aria-labelledby="export-title"
      className="absolute right-3 top-3 z-30 max-h-[calc(100vh-14rem)] w-80 overflow-y-auto rounded-sticker border-2 border-sage bg-white p-4 text-sm shadow-lg"
    >
      <h2 id="export-title" className="mb-2 text-lg font-extrabold">
        Export for print and cut
      </h2>
      {unsaved && <p className="mb-2 text-peel-deep">Saving your latest changes first; the export uses the saved sheet.</p>}
      <div className="flex flex-col gap-2">
        <label className="flex items-center justify-between font-bold">
          Resolution
          <select value={dpi} onChange={(e) => setDpi(Number(e.target.value))} className="rounded border-2 border-paper-edge px-1">
            {[150, 300, 600].map((d) => (
              <option key={d} value={d}>
                {d} DPI
              </option>
            ))}
          </select>
        </label>
        <label className="flex items-center justify-between font-bold">
          Around the stickers
          <select
            value={background}
            onChange={(e) => setBackground(e.target.value as 'transparent' | 'white')}
            className="rounded border-2 border-paper-edge px-1"
          >
            <option value="transparent">Transparent</option>
            <option value="white">White</option>
          </select>
        </label>
        <label className="flex items-center justify-between font-bold">
          Bleed (mm)
          <input
            type="number"
            min={0}
            max={5}
            step={0.5}
            value={bleed}
            onChange={(e) => setBleed(Number(e.target.value))}
            className="w-16 rounded border-2 border-paper-edge px-1 text-right"
          />
        </label>
        <p className="text-xs text-ink-faint">White borders need no bleed; coloured borders: 0.5 to 1.5 mm (common practice).</p>
        <label className="flex items-center gap-2 font-bold">
          <input type="checkbox" checked={sheetCut} onChange={(e) => setSheetCut(e.target.checked)} />
          Die cut around the whole sheet
        </label>
        <label className="flex items-center gap-2 font-bold">
          <input type="checkbox" checked={checkBar} onChange={(e) => setCheckBar(e.target.checked)} />1 in check bar in the PDF's margin
        </label>
        <p className="text-xs text-ink-soft" data-testid="export-marks">
          {printing.marks
            ? `Registration marks from the profile: ${REG_MARK_LABELS[printing.marks.shape].toLowerCase()} ${formatLength(printing.marks.sizeMm)}, ${formatLength(printing.marks.offsetMm)} outside three corners, printed on the PDF page.`
            : 'No registration marks: the cutter software adds its own (set them on the sheet profile if your machine reads printed marks).'}{' '}
          Cut layer colour: {printing.spotColour}.
        </p>
        {printing.marks && (
          <label className="flex items-center gap-2 font-bold">
            <input type="checkbox" checked={marksInCutFile} onChange={(e) => setMarksInCutFile(e.target.checked)} />
            Outline the marks in the cut files too
          </label>
        )}
      </div>
      {errors.length > 0 && (
        <div className="mt-3 rounded-lg border-l-4 border-alarm bg-alarm-light p-2" data-testid="export-preflight">
          <p className="font-bold">
            Preflight found {errors.length} error{errors.length === 1 ? '' : 's'}:
          </p>
          <ul className="ml-4 list-disc text-xs">
            {errors.map((f, i) => (
              <li key={i}>{f.message}</li>
            ))}
          </ul>
          <label className="mt-1 flex items-center gap-2 font-bold">
            <input type="checkbox" checked={acceptErrors} onChange={(e) => setAcceptErrors(e.target.checked)} />
            Export anyway: I have read these
          </label>
        </div>
      )}
      {warnings.length > 0 && (
        <div className="mt-3 rounded-lg border-l-4 border-peel bg-paper-deep p-2" data-testid="export-warnings">
          <p className="font-bold">Check before printing ({warnings.length}):</p>
          <ul className="ml-4 list-disc text-xs">
            {warnings.map((f, i) => (
              <li key={i}>{f.message}</li>
            ))}
          </ul>
        </div>
      )}
      {shown && (
        <div className="mt-3" role="status" data-testid="export-status">
          <progress max={1} value={shown.progress} className="h-2 w-full accent-sage" aria-label="Export progress" />
          <p>
            {shown.status === 'done'
              ? `Ready (sheet version ${shown.sheetVersion}).`
              : shown.status === 'failed'
                ? shown.error
                : `${shown.step}…`}
          </p>
          {shown.status === 'running' && (
            <button type="button" onClick={() => void stop()} className="mt-1 rounded-full border-2 border-paper-edge px-3 font-bold">
              Stop this export
            </button>
          )}
          {shown.status === 'failed' && (
            <button
              type="button"
              onClick={() => void start()}
              disabled={unsaved || (errors.length > 0 && !acceptErrors)}
              className="mt-1 rounded-full border-2 border-alarm px-3 font-bold text-alarm disabled:opacity-50"
            >
              Try again
            </button>
          )}
          {shown.status === 'done' && shown.files.length > 0 && (
            <ul className="mt-1 flex flex-col gap-0.5" aria-label="Files of this export">
              {shown.files.map((f) => (
                <li key={f.name}>
                  <a href={f.url} download={f.name} className="font-bold text-peel-deep underline">
                    {exportFileLabel(f.name)}
                  </a>{' '}
                  <span className="text-xs text-ink-faint">{(f.size / 1024).toFixed(0)} KB</span>
                </li>
              ))}
            </ul>
          )}
          {shown.downloadUrl && (
            <a href={shown.downloadUrl} className="mt-1 inline-block font-bold text-peel-deep underline">
              Everything in one zip
            </a>
          )}
        </div>
      )}
      {error && (
        <p role="alert" className="mt-2 font-semibold text-alarm">
          {error}
        </p>
      )}
      <p className="mt-3 rounded-lg border-l-4 border-peel bg-paper-deep p-2 text-xs font-semibold text-ink" data-testid="print-caution">
        Print at 100 % (actual size): no scaling, no fit-to-page, no borderless expansion. A scaled print puts the cut lines off the art and
        wastes the sheet. Check with a ruler: the print area is {areaText}
        {checkBar ? ', and the bar under it in the PDF is 1 in' : ''}.
      </p>
      <p className="mt-3 text-xs text-ink-faint">
        Before cutting: follow your cutter's manual, keep fingers clear of the moving carriage, and change blades with the tool it provides.
      </p>
      <div className="mt-3 flex gap-2">
        <button
          type="button"
          onClick={() => void start()}
          disabled={unsaved || job?.status === 'running' || (errors.length > 0 && !acceptErrors)}
          className="rounded-full bg-ink px-4 py-1 font-bold text-paper disabled:opacity-50"
        >
          Export
        </button>
        <button type="button" onClick={onClose} className="rounded-full border-2 border-paper-edge px-3 py-1 font-bold">
          Close
        </button>
      </div>
    </section>
  );
}
