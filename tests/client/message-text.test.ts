// The outbox shows a message's text part with its web addresses clickable, and nothing else made
// into markup: React escapes the text, only http(s) addresses become links (WHATWG URL parsing).
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, test } from 'vitest';
import { linkParts, MessageText } from '../../src/features/mail/components/message-text';
import { WITHHELD_LINK } from '../../server/mail/one-time-links';

const render = (text: string) => renderToStaticMarkup(createElement(MessageText, { text }));

describe('outbox message text', () => {
  test('an address on its own line and one ending a sentence become links; the sentence keeps its full stop', () => {
    const html = render(
      'Download them:\nhttp://localhost:3000/venues/abc/certificates\n\nOr see https://hall.example/verify/SW-2026-AB12-CD34-V.',
    );
    expect(html).toContain('<a href="http://localhost:3000/venues/abc/certificates" target="_blank" rel="noopener noreferrer"');
    expect(html).toContain('<a href="https://hall.example/verify/SW-2026-AB12-CD34-V" target="_blank" rel="noopener noreferrer"');
    expect(html).toContain('>https://hall.example/verify/SW-2026-AB12-CD34-V</a><span>.</span>');
  });

  test('the parts put together are the text again', () => {
    const text = 'Ask Ada at ada@lakeshore.example.\nSign in: http://localhost:3000/sign-in\n';
    expect(
      linkParts(text)
        .map((p) => p.text)
        .join(''),
    ).toBe(text);
  });

  test('markup in the text stays text, and other schemes never become links', () => {
    const html = render('<script>alert(1)</script> javascript:alert(1) data:text/html,<b>x</b> <a href="http://evil.example">x</a>');
    expect(html).not.toContain('<script');
    expect(html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
    expect(html).not.toMatch(/href="(javascript|data):/);
    expect(html).not.toContain('<b>');
    // The address inside the quoted markup is cut at the quote: the link is to the bare host, and the markup around it stays text.
    expect(html).toContain('&lt;a href=&quot;</span><a href="http://evil.example/"');
  });

  test('a withheld one-time link stays a note, not a link', () => {
    const html = render(`Choose your password:\n${WITHHELD_LINK}`);
    expect(html).not.toContain('<a ');
    expect(html).toContain('one-time link withheld');
  });
});
