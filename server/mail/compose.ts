// Every message the app sends, written once as blocks and sent as both parts of a
// multipart/alternative message (RFC 2046 §5.1.4): plain text for any client, and simple HTML
// with every value escaped, no images, no styles from elsewhere, no scripts. Each message names
// the organisation, the sign-in address and a person to ask.

export type MailBlock =
  | { kind: 'p'; text: string }
  /** A link on its own line, with what it is for. */
  | { kind: 'link'; label: string; url: string }
  | { kind: 'links'; items: { label: string; url: string }[] };

export interface Contact {
  name: string;
  email: string;
  /** What they are to the reader: "the administrator who invited you". */
  role: string;
}

export interface MailDraft {
  orgName: string;
  /** APP_ORIGIN: where to sign in. */
  origin: string;
  recipientName: string;
  subject: string;
  blocks: MailBlock[];
  /** Null when the organisation has nobody to name (then the reader is told to ask their administrator). */
  contact: Contact | null;
}

export const p = (text: string): MailBlock => ({ kind: 'p', text });
export const link = (label: string, url: string): MailBlock => ({ kind: 'link', label, url });

/** HTML text and attribute escaping (the five characters the HTML standard's serialisation escapes). */
export function escapeHtml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

/** Only our own http(s) addresses become links; anything else is written out as text. */
function safeUrl(url: string): string | null {
  try {
    const u = new URL(url);
    return u.protocol === 'https:' || u.protocol === 'http:' ? u.href : null;
  } catch {
    return null;
  }
}

function askLine(d: MailDraft): string {
  return d.contact
    ? `Questions? Ask ${d.contact.name} (${d.contact.role}) at ${d.contact.email}.`
    : 'Questions? Ask an administrator of your organisation.';
}

function textOf(d: MailDraft): string {
  const body = d.blocks.map((b) => {
    if (b.kind === 'p') return b.text;
    if (b.kind === 'link') return `${b.label}:\n${b.url}`;
    return b.items.map((i) => `  ${i.label}\n  ${i.url}`).join('\n\n');
  });
  const footer = [`${d.orgName} · electrical checks with Stripwarden`, `Sign in: ${d.origin}/sign-in`, askLine(d)];
  return `Hello ${d.recipientName},\n\n${body.join('\n\n')}\n\n-- \n${footer.join('\n')}\n`;
}

function anchor(label: string, url: string): string {
  const safe = safeUrl(url);
  return safe ? `<a href="${escapeHtml(safe)}">${escapeHtml(label)}</a>` : `${escapeHtml(label)}: ${escapeHtml(url)}`;
}

function htmlOf(d: MailDraft): string {
  const blocks = d.blocks.map((b) => {
    if (b.kind === 'p') return `<p>${escapeHtml(b.text)}</p>`;
    // The address is written out too: it can be copied where links are not followed.
    if (b.kind === 'link') return `<p>${anchor(b.label, b.url)}<br><span style="color:#555">${escapeHtml(b.url)}</span></p>`;
    return `<ul>${b.items.map((i) => `<li>${anchor(i.label, i.url)}<br><span style="color:#555">${escapeHtml(i.url)}</span></li>`).join('')}</ul>`;
  });
  const ask = d.contact
    ? `Questions? Ask ${escapeHtml(d.contact.name)} (${escapeHtml(d.contact.role)}) at <a href="mailto:${escapeHtml(encodeURIComponent(d.contact.email).replace(/%40/g, '@'))}">${escapeHtml(d.contact.email)}</a>.`
    : 'Questions? Ask an administrator of your organisation.';
  const footer = [
    `<strong>${escapeHtml(d.orgName)}</strong> · electrical checks with Stripwarden`,
    `Sign in: ${anchor(`${d.origin}/sign-in`, `${d.origin}/sign-in`)}`,
    ask,
  ];
  return [
    '<!doctype html>',
    `<html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(d.subject)}</title></head>`,
    '<body style="font-family:sans-serif;font-size:16px;line-height:1.5;color:#1a1a1a;max-width:40em">',
    `<p>Hello ${escapeHtml(d.recipientName)},</p>`,
    ...blocks,
    `<hr><p style="font-size:14px;color:#444">${footer.join('<br>')}</p>`,
    '</body></html>',
  ].join('\n');
}

/** The two parts of one message. */
export function composeMail(d: MailDraft): { subject: string; text: string; html: string } {
  return { subject: d.subject, text: textOf(d), html: htmlOf(d) };
}
