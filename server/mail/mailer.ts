import { mkdir, readdir, readFile, rename, writeFile } from 'node:fs/promises';
import path from 'node:path';
import nodemailer from 'nodemailer';
import type { Env } from '../config/env';

export type OutgoingMail = { to: string; subject: string; text: string; html?: string };

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  /** The folder messages are written to when no SMTP server is configured, else null. */
  readonly outboxDir: string | null;
}

/**
 * Real SMTP when SMTP_HOST is set; otherwise nodemailer's stream transport renders each message
 * and we write it as an .eml file under DATA_DIR/outbox (written to a temp name, then renamed).
 */
export function createMailer(env: Env): Mailer {
  if (env.SMTP_HOST) {
    const transport = nodemailer.createTransport({
      host: env.SMTP_HOST,
      port: env.SMTP_PORT,
      secure: env.SMTP_SECURE,
      auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASSWORD } : undefined,
    });
    return {
      outboxDir: null,
      async send(mail) {
        await transport.sendMail({ from: env.MAIL_FROM, ...mail });
      },
    };
  }
  const transport = nodemailer.createTransport({ streamTransport: true, buffer: true, newline: 'unix' });
  const dir = env.outboxDir;
  let counter = 0;
  return {
    outboxDir: dir,
    async send(mail) {
      const info = await transport.sendMail({ from: env.MAIL_FROM, ...mail });
      await mkdir(dir, { recursive: true });
      const stamp = new Date().toISOString().replace(/[:.]/g, '-');
      const slug = mail.to.replace(/[^a-z0-9]+/gi, '_').slice(0, 40);
      const name = `${stamp}-${process.pid}-${++counter}-${slug}.eml`;
      const tmp = path.join(dir, `.${name}.tmp`);
      await writeFile(tmp, info.message as Buffer);
      await rename(tmp, path.join(dir, name));
    },
  };
}

type OutboxEntry = { file: string; to: string; subject: string; date: string };

/** Lists the outbox newest first, reading only each message's headers. */
export async function listOutbox(dir: string): Promise<OutboxEntry[]> {
  let files: string[];
  try {
    files = (await readdir(dir)).filter((file) => file.endsWith('.eml'));
  } catch {
    return [];
  }
  const entries = await Promise.all(
    files.map(async (file) => {
      const text = await readFile(path.join(dir, file), 'utf8');
      const head = text.slice(0, text.indexOf('\n\n'));
      const header = (name: string) => new RegExp(`^${name}: (.*)$`, 'mi').exec(head)?.[1] ?? '';
      return { file, to: header('To'), subject: header('Subject'), date: header('Date') };
    }),
  );
  return entries.sort((a, b) => b.file.localeCompare(a.file));
}
