import type { ReactNode } from 'react';
import { Logo } from '@/components/logo';

/** The signed-out pages: a sticker-sheet card on paper. */
export function AuthLayout({ title, children, footer }: { title: string; children: ReactNode; footer?: ReactNode }) {
  return (
    <main className="flex min-h-screen flex-col items-center justify-center gap-6 bg-paper px-4 py-10">
      <Logo size={48} />
      <section
        aria-labelledby="auth-title"
        className="w-full max-w-md rounded-sticker border-2 border-dashed border-ink-faint/50 bg-white p-8 shadow-[0_10px_0_0_#e7d6bd]"
      >
        <h1 id="auth-title" className="mb-6 text-2xl font-extrabold text-ink">
          {title}
        </h1>
        {children}
      </section>
      {footer && <div className="text-sm text-ink-soft">{footer}</div>}
    </main>
  );
}
