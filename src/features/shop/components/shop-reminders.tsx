import { useMachines, useStock } from '@/api/shop';

/** What needs doing before the next run: stock at or below its running-low mark, blades near or due. */
export function ShopReminders({ teamId }: { teamId: string }) {
  const stock = useStock(teamId);
  const machines = useMachines(teamId);
  const low = (stock.data ?? []).filter((s) => s.low);
  const blades = (machines.data ?? []).flatMap((m) => (m.blade && m.blade.wear !== 'ok' ? [{ cutter: m.name, blade: m.blade }] : []));
  if (low.length === 0 && blades.length === 0) return null;
  return (
    <section
      aria-labelledby="reminders-title"
      className="rounded-sticker border-2 border-peel bg-peel-light p-4 text-sm"
      data-testid="reminders"
    >
      <h2 id="reminders-title" className="mb-1 font-extrabold">
        Before the next run
      </h2>
      <ul className="list-disc pl-5">
        {low.map((s) => (
          <li key={s.id}>
            {s.name}: {s.onHand} sheet{s.onHand === 1 ? '' : 's'} on hand, running low (at {s.lowAt} or fewer). Order more.
          </li>
        ))}
        {blades.map(({ cutter, blade }) => (
          <li key={blade.id}>
            {cutter}: blade “{blade.label}” {blade.wear === 'due' ? 'is due for a change' : 'is nearly due'} ({blade.wearReason}). Switch
            the cutter off and follow its manual when you change it.
          </li>
        ))}
      </ul>
    </section>
  );
}
