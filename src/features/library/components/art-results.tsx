import { Link } from 'react-router';
import type { ArtView } from '@shared/schemas/library';
import type { LengthUnit } from '@shared/units';
import { formatLength } from '@shared/units';

type Props = {
  items: ArtView[];
  unit: LengthUnit;
  selected: Set<string>;
  onToggle: (id: string) => void;
  onToggleAll: () => void;
  sort: string;
  dir: 'asc' | 'desc';
  onSort: (sort: 'created' | 'name' | 'size' | 'pixels') => void;
};

const printSize = (item: ArtView, unit: LengthUnit) =>
  `${formatLength(item.largestPrint.at300.widthMm, unit, unit === 'in' ? 2 : 0)} × ${formatLength(item.largestPrint.at300.heightMm, unit, unit === 'in' ? 2 : 0)}`;

export function ArtGrid({ items, unit, selected, onToggle }: Props) {
  return (
    <ul className="grid grid-cols-2 gap-4 sm:grid-cols-3 lg:grid-cols-4 xl:grid-cols-5" data-testid="art-grid">
      {items.map((item) => (
        <li
          key={item.id}
          className={`relative rounded-sticker border-2 bg-white p-2 ${selected.has(item.id) ? 'border-peel' : 'border-paper-edge'}`}
        >
          <label className="absolute left-3 top-3 z-10 rounded bg-white/90 px-1">
            <input type="checkbox" checked={selected.has(item.id)} onChange={() => onToggle(item.id)} aria-label={`Select ${item.name}`} />
          </label>
          <Link to={item.id} className="block rounded-lg focus:outline-none">
            <div className="flex aspect-square items-center justify-center rounded-lg bg-[repeating-conic-gradient(#f6ead8_0_25%,#fff_0_50%)] bg-[length:16px_16px]">
              <img src={item.thumbnailUrl} alt="" loading="lazy" className="max-h-full max-w-full object-contain" />
            </div>
            <p className="mt-2 truncate font-bold" title={item.name}>
              {item.name}
            </p>
          </Link>
          <p className="text-xs text-ink-soft">up to {printSize(item, unit)} at 300 DPI</p>
          <p className="mt-1 flex flex-wrap gap-1">
            {!item.hasTransparency && <span className="rounded-full bg-peel-light px-2 text-xs text-peel-deep">no transparency</span>}
            {item.keywords.slice(0, 4).map((k) => (
              <span key={k} className="rounded-full bg-sage-light px-2 text-xs text-sage-deep">
                {k}
              </span>
            ))}
          </p>
        </li>
      ))}
    </ul>
  );
}

export function ArtTable({ items, unit, selected, onToggle, onToggleAll, sort, dir, onSort }: Props) {
  const header = (key: 'created' | 'name' | 'size' | 'pixels', label: string) => (
    <th aria-sort={sort === key ? (dir === 'asc' ? 'ascending' : 'descending') : 'none'} className="py-2 text-left">
      <button type="button" className="font-bold underline-offset-2 hover:underline" onClick={() => onSort(key)}>
        {label} {sort === key ? (dir === 'asc' ? '▲' : '▼') : ''}
      </button>
    </th>
  );
  return (
    <table className="w-full rounded-sticker bg-white text-sm" data-testid="art-table">
      <thead className="text-ink-soft">
        <tr>
          <th className="w-8 px-2">
            <input
              type="checkbox"
              aria-label="Select all on this page"
              checked={items.length > 0 && items.every((i) => selected.has(i.id))}
              onChange={onToggleAll}
            />
          </th>
          <th>
            <span className="sr-only">Preview</span>
          </th>
          {header('name', 'Name')}
          <th className="text-left">Keywords</th>
          <th className="text-left">Collection</th>
          {header('pixels', 'Pixels')}
          <th className="text-left">Largest at 300 DPI</th>
          {header('size', 'File')}
          {header('created', 'Added')}
        </tr>
      </thead>
      <tbody>
        {items.map((item) => (
          <tr key={item.id} className="border-t border-paper-deep">
            <td className="px-2">
              <input
                type="checkbox"
                checked={selected.has(item.id)}
                onChange={() => onToggle(item.id)}
                aria-label={`Select ${item.name}`}
              />
            </td>
            <td className="py-1">
              <img src={item.thumbnailUrl} alt="" className="h-10 w-10 object-contain" loading="lazy" />
            </td>
            <td>
              <Link to={item.id} className="font-bold underline">
                {item.name}
              </Link>
            </td>
            <td className="text-ink-soft">{item.keywords.join(', ')}</td>
            <td>{item.collections.length ? item.collections.map((c) => c.name).join(', ') : '—'}</td>
            <td>
              {item.widthPx} × {item.heightPx}
            </td>
            <td>{printSize(item, unit)}</td>
            <td>{(item.sizeBytes / 1024).toFixed(0)} KB</td>
            <td>{new Date(item.createdAt).toLocaleDateString()}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
