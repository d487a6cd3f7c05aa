import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { env } from '../../server/config/env';
import { listOutbox } from '../../server/mail/mailer';

/** The newest .eml written to `to`, decoded enough to read its links. */
export async function lastMailTo(to: string): Promise<{ subject: string; text: string; links: string[] }> {
  const entry = (await listOutbox(env.outboxDir)).find((m) => m.to.includes(to));
  if (!entry) throw new Error(`no e-mail to ${to} in ${env.outboxDir}`);
  const raw = await readFile(path.join(env.outboxDir, entry.file), 'utf8');
  // Undo quoted-printable soft breaks and =XX escapes (RFC 2045 §6.7) before looking for links.
  const text = raw.replace(/=\r?\n/g, '').replace(/=([0-9A-F]{2})/g, (_m, hex) => String.fromCharCode(parseInt(hex, 16)));
  return { subject: entry.subject, text, links: text.match(/https?:\/\/\S+/g) ?? [] };
}

export const tokenFrom = (link: string) => link.split('/').pop()!;
