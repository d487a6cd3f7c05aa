import type { CollectionView } from '@shared/schemas/library';

/** "Put into collection": the team's collections that take art (archived ones do not), or none. */
export function CollectionSelect({
  value,
  onChange,
  collections,
  className,
}: {
  value: string;
  onChange: (id: string) => void;
  collections: CollectionView[];
  className: string;
}) {
  return (
    <select value={value} onChange={(e) => onChange(e.target.value)} className={className}>
      <option value="">No collection</option>
      {collections
        .filter((c) => !c.archived)
        .map((c) => (
          <option key={c.id} value={c.id}>
            {c.name}
          </option>
        ))}
    </select>
  );
}
