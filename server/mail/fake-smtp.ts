import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import type { AddressInfo } from 'node:net';
import type { Db } from '../db/client';
import { capturedMail } from '../db/schema';

// A local SMTP server that keeps what it receives, so demo, dev and tests send real SMTP without
// anything leaving the machine. Listens on 127.0.0.1 only.
export async function startFakeSmtp(db: Db, port: number): Promise<{ port: number; close: () => Promise<void> }> {
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
          const raw = Buffer.concat(chunks);
          const mail = await simpleParser(raw);
          const to = Array.isArray(mail.to) ? mail.to.map((a) => a.text).join(', ') : (mail.to?.text ?? '');
          db.insert(capturedMail)
            .values({
              fromAddress: mail.from?.text ?? '',
              toAddresses: to,
              subject: mail.subject ?? '',
              text: mail.text ?? '',
              html: typeof mail.html === 'string' ? mail.html : null,
              raw: raw.toString('utf8'),
            })
            .run();
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
