import type { AppDeps } from '../deps';
import { mailRepository } from '../db/mail.repository';
import { notFound } from '../lib/app-error';

// The local outbox: what the fake SMTP server received.
export function mailService(deps: AppDeps) {
  const repo = mailRepository(deps.db);
  return {
    list: () => repo.list(),
    get(id: number) {
      const m = Number.isInteger(id) ? repo.get(id) : undefined;
      if (!m) throw notFound('That message');
      return { id: m.id, fromAddress: m.fromAddress, toAddresses: m.toAddresses, subject: m.subject, text: m.text, receivedAt: m.receivedAt };
    },
  };
}
