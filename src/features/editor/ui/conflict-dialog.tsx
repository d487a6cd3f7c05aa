/** A teammate saved first: nothing is overwritten; keep this version as a copy or load theirs. */
export function ConflictDialog({
  message,
  keepCopy,
  loadTheirs,
}: {
  message: string | null;
  keepCopy: () => Promise<void>;
  loadTheirs: () => Promise<void>;
}) {
  return (
    <div
      role="alertdialog"
      aria-modal="true"
      aria-labelledby="conflict-title"
      className="fixed inset-0 z-50 flex items-center justify-center bg-ink/40 p-4"
    >
      <div className="w-full max-w-md rounded-sticker bg-white p-6">
        <h2 id="conflict-title" className="mb-2 text-xl font-extrabold">
          Someone else saved this sheet
        </h2>
        <p className="mb-4 text-sm text-ink-soft">{message} Your changes are still here; nothing was overwritten.</p>
        <div className="flex flex-wrap gap-2">
          <button type="button" className="rounded-full bg-ink px-4 py-2 font-bold text-paper" onClick={() => void keepCopy()}>
            Keep mine as a copy
          </button>
          <button type="button" className="rounded-full border-2 border-ink px-4 py-2 font-bold" onClick={() => void loadTheirs()}>
            Load their version
          </button>
        </div>
      </div>
    </div>
  );
}
