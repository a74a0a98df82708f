import { describe, expect, it } from 'vitest';
import MailComposer from 'nodemailer/lib/mail-composer';
import { parseMessage } from './parse-message.ts';

/** Builds the raw message with nodemailer's own composer: the reference for what our fake receives. */
async function compose(options: ConstructorParameters<typeof MailComposer>[0]): Promise<string> {
  const buffer = await new MailComposer(options).compile().build();
  return buffer.toString('utf8');
}

describe('parseMessage', () => {
  it('reads a multipart/alternative message with text and html', async () => {
    const raw = await compose({
      from: 'Parley <parley@localhost>',
      to: 'qa@kestrel.example',
      subject: 'You are invited',
      text: 'Hello\nOpen http://localhost/invite/abc',
      html: '<p>Hello</p>',
    });
    expect(raw).toContain('multipart/alternative');
    expect(parseMessage(raw)).toEqual({
      from: 'Parley <parley@localhost>',
      to: 'qa@kestrel.example',
      subject: 'You are invited',
      text: 'Hello\nOpen http://localhost/invite/abc',
      html: '<p>Hello</p>',
    });
  });

  it('decodes quoted-printable bodies, long lines and RFC 2047 subjects', async () => {
    const longLine = `Ready: ${'0123456789'.repeat(12)} — 20 V ⎓ 3.25 A`;
    const raw = await compose({ from: 'a@b.example', to: 'c@d.example', subject: 'Réinitialiser ⎓', text: longLine, html: `<p>${longLine}</p>` });
    expect(raw).toMatch(/quoted-printable/i);
    expect(raw).toMatch(/=\?UTF-8\?/i);
    const parsed = parseMessage(raw);
    expect(parsed.subject).toBe('Réinitialiser ⎓');
    expect(parsed.text).toBe(longLine);
    expect(parsed.html).toBe(`<p>${longLine}</p>`);
  });

  it('decodes base64 bodies', async () => {
    const raw = await compose({ from: 'a@b.example', to: 'c@d.example', subject: 'x', text: 'Grüße aus Parley', textEncoding: 'base64' });
    expect(raw).toMatch(/base64/i);
    expect(parseMessage(raw).text).toBe('Grüße aus Parley');
  });
});
