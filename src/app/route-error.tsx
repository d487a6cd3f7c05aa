import { Link, useRouteError } from 'react-router';
import { Logo } from '../components/logo';

export function RouteError({ notFound = false }: { notFound?: boolean }) {
  const error = useRouteError() as { message?: string } | undefined;
  return (
    <main className="flex min-h-screen flex-col items-center justify-center gap-4 bg-paper p-6 text-center">
      <Logo size={48} />
      <h1 className="text-2xl font-extrabold">{notFound ? 'No page here' : 'This page hit a snag'}</h1>
      <p className="max-w-md text-ink-soft">
        {notFound ? 'The address may be mistyped or the page moved.' : (error?.message ?? 'Reload to try again. Saved work is safe.')}
      </p>
      <Link to="/" className="font-bold text-peel-deep underline">
        Back to Sheetsmith
      </Link>
    </main>
  );
}
