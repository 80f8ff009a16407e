import { describe, expect, it } from 'vitest';
import { layoutMail } from './mailer.ts';

describe('layoutMail', () => {
  // Channel names, episode titles and comments are typed by people: none may become markup in the HTML part.
  const hostile = '<img src=x onerror=alert(1)> & "Bench" \'one\'';
  const mail = layoutMail({
    channelName: hostile,
    heading: `“${hostile}” needs approval`,
    paragraphs: [`Comment: <script>alert(2)</script>`],
    action: { label: 'Open <b>it</b>', url: 'http://127.0.0.1:4100/episodes/1?a=1&b="2"' },
  });

  it('escapes every text in the HTML part (OWASP output encoding for HTML text and attributes)', () => {
    expect(mail.html).not.toMatch(/<img|<script|<b>|onerror=alert\(1\)>/);
    expect(mail.html).toContain('&lt;img src=x onerror=alert(1)&gt; &amp; &quot;Bench&quot; &#39;one&#39;');
    expect(mail.html).toContain('&lt;script&gt;alert(2)&lt;/script&gt;');
    expect(mail.html).toContain('href="http://127.0.0.1:4100/episodes/1?a=1&amp;b=&quot;2&quot;"');
  });

  it('keeps the text part as typed, with the link spelt out', () => {
    expect(mail.text).toContain(`“${hostile}” needs approval`);
    expect(mail.text).toContain('Open <b>it</b>: http://127.0.0.1:4100/episodes/1?a=1&b="2"');
  });
});
