/** Sheetsmith's mark: a sticker with a peeled corner and a dashed cut line around an "S". */
export function Logo({ size = 36, withName = true }: { size?: number; withName?: boolean }) {
  return (
    <span className="inline-flex items-center gap-2">
      <svg width={size} height={size} viewBox="0 0 40 40" aria-hidden="true">
        <path d="M7 3h20l10 10v20a4 4 0 0 1-4 4H7a4 4 0 0 1-4-4V7a4 4 0 0 1 4-4z" fill="#1f3a3d" />
        <path
          d="M8.5 6.5h17l8 8v17.5a2.5 2.5 0 0 1-2.5 2.5H8.5A2.5 2.5 0 0 1 6 32V9a2.5 2.5 0 0 1 2.5-2.5z"
          fill="none"
          stroke="#fff7ec"
          strokeWidth="1"
          strokeDasharray="2.2 1.8"
          opacity="0.7"
        />
        <path d="M27 3v7a3 3 0 0 0 3 3h7z" fill="#f08a5d" />
        <path
          d="M14 24.5c0 2.6 2.6 3.9 6 3.9s6-1.3 6-4.3-3-3.7-6-4.2-5.4-1.3-5.4-3.9S16.9 12 20 12s5.5 1.3 5.5 3.6"
          fill="none"
          stroke="#fff7ec"
          strokeWidth="2.8"
          strokeLinecap="round"
        />
      </svg>
      {withName && <span className="text-xl font-extrabold tracking-tight text-ink">Sheetsmith</span>}
    </span>
  );
}
