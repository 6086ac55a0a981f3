import type { AppDeps } from '../deps';
import { mailRepository } from '../db/mail.repository';
import { notFound } from '../lib/app-error';
import { withholdOneTimeLinks } from '../mail/one-time-links';

// The local outbox: what the fake SMTP server received, for the admins of the organisation that
// sent it. Another organisation's message answers 404 like any object of theirs.
export function mailService(deps: AppDeps) {
  const repo = mailRepository(deps.db);
  return {
    list: (orgId: string) => repo.list(orgId),
    get(orgId: string, id: number) {
      const m = Number.isSafeInteger(id) ? repo.get(orgId, id) : undefined;
      if (!m) throw notFound('That message');
      // Stored messages hold no one-time links; this also covers messages kept by older versions.
      const text = withholdOneTimeLinks(m.text).text;
      return { id: m.id, fromAddress: m.fromAddress, toAddresses: m.toAddresses, subject: m.subject, text, receivedAt: m.receivedAt };
    },
  };
}
