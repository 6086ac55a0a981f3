// One-time links (choose a password after an invitation, reset a password) hand over an account to
// whoever holds them. The outbox never keeps or shows them: they are withheld from what is stored,
// and from what is shown of messages stored before (OWASP ASVS 5.0 6.4.2, secrets sent only to
// the account's holder). With the local SMTP fake, the server prints them on its own console.

const ONE_TIME_LINK = /(?:https?:\/\/[^\s"'<>()]*)?\/set-password\/[A-Za-z0-9_-]+/g;

export const WITHHELD_LINK = '[one-time link withheld from the outbox: it is for the addressee alone]';

/** The text with every one-time link replaced by a note, and the links that were in it. */
export function withholdOneTimeLinks(text: string): { text: string; links: string[] } {
  const links: string[] = [];
  const out = text.replace(ONE_TIME_LINK, (link) => {
    links.push(link);
    return WITHHELD_LINK;
  });
  return { text: out, links };
}
