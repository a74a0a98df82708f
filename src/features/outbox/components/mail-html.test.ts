import { describe, expect, it } from 'vitest';
import { mailSrcDoc, splitUrls } from './mail-html.ts';

describe('mailSrcDoc', () => {
  it('replaces the doctype and adds a no-remote-loads policy and new-tab links before the body', () => {
    const doc = mailSrcDoc('<!doctype html><html><body><p>Hi</p></body></html>');
    expect(doc.startsWith('<!doctype html>\n<meta charset="utf-8">')).toBe(true);
    expect(doc).toContain(`default-src 'none'`);
    expect(doc).toContain('<base target="_blank">');
    expect(doc.match(/<!doctype/gi)).toHaveLength(1);
    expect(doc.endsWith('<html><body><p>Hi</p></body></html>')).toBe(true);
  });
});

describe('splitUrls', () => {
  it('separates URLs from the text around them', () => {
    expect(splitUrls('Open http://localhost:4000/invite/abc now.\n')).toEqual([
      { kind: 'text', value: 'Open ' },
      { kind: 'url', value: 'http://localhost:4000/invite/abc' },
      { kind: 'text', value: ' now.\n' },
    ]);
  });

  it('returns plain text untouched', () => {
    expect(splitUrls('no links')).toEqual([{ kind: 'text', value: 'no links' }]);
  });
});
