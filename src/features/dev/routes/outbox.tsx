import { useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { FormMessage } from '@/components/form';
import { PageTitle } from '@/components/page-title';
import { ApiError, api } from '@/lib/api-client';

const outboxSchema = z.object({
  messages: z.array(z.object({ file: z.string(), to: z.string(), subject: z.string(), date: z.string() })),
});

/** Development only: e-mails the local fake mailer wrote instead of sending. */
export function OutboxRoute() {
  const outbox = useQuery({
    queryKey: ['dev', 'outbox'],
    queryFn: async () => outboxSchema.parse(await api('GET', '/dev/outbox')),
    refetchInterval: 5000,
  });
  return (
    <main className="mx-auto max-w-4xl p-6">
      <PageTitle title="Local outbox" />
      <p className="mb-4 text-sm text-ink-soft">No SMTP server is set, so e-mails are written here instead of sent.</p>
      {outbox.isError && (
        <FormMessage>
          {outbox.error instanceof ApiError && outbox.error.status === 404
            ? 'This server shows no outbox: it is listed only in development and when Sheetsmith runs on this computer alone (demo mode). Here e-mails go out by SMTP, or are written as .eml files into the outbox folder under DATA_DIR.'
            : outbox.error.message}
        </FormMessage>
      )}
      <ul className="flex flex-col gap-2">
        {outbox.data?.messages.map((m) => (
          <li key={m.file} className="rounded-lg border-2 border-paper-edge bg-white p-3">
            <a className="font-bold text-peel-deep underline" href={`/api/dev/outbox/${m.file}`}>
              {m.subject}
            </a>
            <div className="text-sm text-ink-soft">
              to {m.to} · {m.date}
            </div>
          </li>
        ))}
        {outbox.data?.messages.length === 0 && <li>The outbox is empty.</li>}
      </ul>
    </main>
  );
}
