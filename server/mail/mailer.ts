import nodemailer from 'nodemailer';

export interface OutgoingMail {
  /** The organisation the message is sent for: its admins alone see it in the local outbox. */
  orgId: string;
  to: string;
  subject: string;
  text: string;
  html?: string;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  close(): void;
}

/** The header that tells the local fake which organisation a message belongs to. */
export const ORGANISATION_HEADER = 'X-Stripwarden-Organisation';

/**
 * Real SMTP in production (SMTP_URL); the local fake SMTP server otherwise. Only the local fake is
 * told the organisation (a header): mail leaving the machine carries no internal ids.
 */
export function createMailer(smtpUrl: string, from: string, opts: { localFake: boolean }): Mailer {
  const transport = nodemailer.createTransport(smtpUrl);
  return {
    async send({ orgId, ...mail }) {
      await transport.sendMail({ from, ...mail, ...(opts.localFake ? { headers: { [ORGANISATION_HEADER]: orgId } } : {}) });
    },
    close: () => transport.close(),
  };
}
