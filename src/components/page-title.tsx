import type { ReactNode } from 'react';

export function PageTitle({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="mb-6 flex flex-wrap items-end justify-between gap-4">
      <h1 className="text-3xl font-extrabold text-ink">{title}</h1>
      {children}
    </div>
  );
}

export function EmptyState({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section className="rounded-sticker border-2 border-dashed border-paper-edge bg-white p-10 text-center">
      <h2 className="mb-2 text-xl font-extrabold text-ink">{title}</h2>
      <div className="mx-auto max-w-prose text-ink-soft">{children}</div>
    </section>
  );
}
