import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import { eq } from 'drizzle-orm';
import type { AddressInfo } from 'node:net';
import type { Db } from '../db/client';
import { capturedMail, organisations } from '../db/schema';
import { ORGANISATION_HEADER } from './mailer';
import { withholdOneTimeLinks } from './one-time-links';

export interface OneTimeLink {
  to: string;
  subject: string;
  link: string;
}

/** The message's header block (up to the first empty line): what is kept of a message that held a one-time link. */
function headerBlock(raw: string): string {
  const end = raw.search(/\r?\n\r?\n/);
  return end < 0 ? raw : raw.slice(0, end);
}

// A local SMTP server that keeps what it receives, so demo, dev and tests send real SMTP without
// anything leaving the machine. Listens on 127.0.0.1 only. One-time links are never stored: each is
// handed to `onOneTimeLink` (the server prints it on its console) and withheld from the copy kept.
export async function startFakeSmtp(
  db: Db,
  port: number,
  opts: { onOneTimeLink?: (l: OneTimeLink) => void } = {},
): Promise<{ port: number; close: () => Promise<void> }> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    size: 5 * 1024 * 1024,
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', async () => {
        try {
          const raw = Buffer.concat(chunks).toString('utf8');
          // Not the text turned into HTML with its links found (nothing uses it): for the sign-off
          // e-mail's 121 links that alone held the event loop for 30–90 ms.
          const mail = await simpleParser(raw, { skipTextToHtml: true, skipTextLinks: true });
          const to = Array.isArray(mail.to) ? mail.to.map((a) => a.text).join(', ') : (mail.to?.text ?? '');
          const claimed = mail.headers.get(ORGANISATION_HEADER.toLowerCase());
          const orgId =
            typeof claimed === 'string' &&
            db.select({ id: organisations.id }).from(organisations).where(eq(organisations.id, claimed)).get()
              ? claimed
              : null;
          const text = withholdOneTimeLinks(mail.text ?? '');
          const html = typeof mail.html === 'string' ? withholdOneTimeLinks(mail.html) : null;
          const links = [...new Set([...text.links, ...(html?.links ?? [])])];
          db.insert(capturedMail)
            .values({
              orgId,
              fromAddress: mail.from?.text ?? '',
              toAddresses: to,
              subject: mail.subject ?? '',
              text: text.text,
              html: html?.text ?? null,
              // The raw body may hold a link in any transfer encoding: then only the headers are kept.
              raw: links.length > 0 ? headerBlock(raw) : raw,
            })
            .run();
          for (const link of links) opts.onOneTimeLink?.({ to, subject: mail.subject ?? '', link });
          callback();
        } catch (err) {
          callback(err as Error);
        }
      });
    },
  });
  const listen = (p: number) =>
    new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(p, '127.0.0.1', () => {
        server.off('error', reject);
        resolve();
      });
    });
  try {
    await listen(port);
  } catch (err) {
    // The configured port is taken (a second instance, a parallel test worker): take any free one.
    if ((err as NodeJS.ErrnoException).code !== 'EADDRINUSE' || port === 0) throw err;
    await listen(0);
  }
  const actual = (server.server.address() as AddressInfo).port;
  return { port: actual, close: () => new Promise<void>((r) => server.close(() => r())) };
}
