import { describe, expect, it } from 'vitest';
import { appLink, renderMail, type MailView } from './templates.js';

const view: MailView = {
  subject: 'You are invited\nBcc: someone',
  preheader: 'Set your password',
  heading: 'Welcome to <Kerfline>',
  paragraphs: ['Invited by Smith & Sons <b>bold</b>'],
  action: { label: 'Set up your account', url: 'https://k.example/invitation#token=abc' },
  sections: [
    { title: 'Saws', columns: ['Tag', 'Name'], rows: [['HS-1', '<script>x</script>']], empty: 'None' },
    { title: 'Flags', columns: ['Saw'], rows: [], empty: 'No flags this week.' },
  ],
  notes: ['The link works for 7 days.'],
  footer: 'You get this because someone invited you.',
};

describe('mail templates', () => {
  it('escape every value in the HTML and keep it readable in the text', () => {
    const mail = renderMail(view);
    expect(mail.html).toContain('Welcome to &lt;Kerfline&gt;');
    expect(mail.html).toContain('Smith &amp; Sons &lt;b&gt;bold&lt;/b&gt;');
    expect(mail.html).toContain('&lt;script&gt;x&lt;/script&gt;');
    expect(mail.html).not.toContain('<script>');
    expect(mail.text).toContain('Invited by Smith & Sons <b>bold</b>');
    expect(mail.text).toContain('- HS-1 · <script>x</script>');
    expect(mail.text).toContain('No flags this week.');
    expect(mail.text).toContain('https://k.example/invitation#token=abc');
    expect(mail.html).toContain('href="https://k.example/invitation#token&#x3D;abc"');
  });

  it('keeps a subject on one line, so no header can be slipped in', () => {
    expect(renderMail(view).subject).toBe('You are invited Bcc: someone');
  });

  it('builds links from the configured public address', () => {
    expect(appLink('https://kerfline.example.com/', '/reset-password', { token: 'a_b-c' })).toBe(
      'https://kerfline.example.com/reset-password#token=a_b-c',
    );
    expect(appLink('http://127.0.0.1:3000', 'account')).toBe('http://127.0.0.1:3000/account');
  });
});
