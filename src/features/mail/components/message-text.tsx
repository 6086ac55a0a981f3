// The text part of a captured message, with its web addresses clickable. Only the text part is
// shown: the HTML part is never put into the page. React escapes every piece; an address becomes a
// link only when it parses as http(s), and it opens apart from the app (noopener, noreferrer).
// One-time links were withheld before the text reached us, so there is nothing to hide here.

const URL_IN_TEXT = /\bhttps?:\/\/[^\s<>"'`]+/g;
// Punctuation that ends a sentence is not part of the address before it.
const TRAILING = /[.,;:!?)\]}]+$/;

function webAddress(raw: string): string | null {
  try {
    const u = new URL(raw);
    return u.protocol === 'http:' || u.protocol === 'https:' ? u.href : null;
  } catch {
    return null;
  }
}

export type TextPart = { text: string } | { href: string; text: string };

/** The text cut into plain runs and http(s) links, in order; together they are the text again. */
export function linkParts(text: string): TextPart[] {
  const parts: TextPart[] = [];
  let at = 0;
  for (const m of text.matchAll(URL_IN_TEXT)) {
    const raw = m[0].replace(TRAILING, '');
    const start = m.index;
    const href = webAddress(raw);
    if (!href) continue;
    if (start > at) parts.push({ text: text.slice(at, start) });
    parts.push({ href, text: raw });
    at = start + raw.length;
  }
  if (at < text.length) parts.push({ text: text.slice(at) });
  return parts;
}

export function MessageText({ text }: { text: string }) {
  return (
    <pre className="mt-4 whitespace-pre-wrap break-words font-sans text-sm" data-testid="message-text">
      {linkParts(text).map((part, i) =>
        'href' in part ? (
          <a key={i} href={part.href} target="_blank" rel="noopener noreferrer" className="text-brand underline">
            {part.text}
          </a>
        ) : (
          <span key={i}>{part.text}</span>
        ),
      )}
    </pre>
  );
}
