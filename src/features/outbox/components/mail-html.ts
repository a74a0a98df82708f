/**
 * Wraps a stored mail's HTML for a sandboxed iframe's srcdoc: no scripts (sandbox), no remote
 * loads (a CSP of its own: tracking pixels and remote fonts stay blocked), links open in a new tab.
 */
export function mailSrcDoc(html: string): string {
  const body = html.replace(/^\s*<!doctype[^>]*>/i, '');
  return [
    '<!doctype html>',
    '<meta charset="utf-8">',
    `<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:">`,
    '<base target="_blank">',
    body,
  ].join('\n');
}

/** Splits plain text into text and URLs, so URLs on this site can become links. */
export function splitUrls(text: string): Array<{ kind: 'text' | 'url'; value: string }> {
  const parts: Array<{ kind: 'text' | 'url'; value: string }> = [];
  const pattern = /https?:\/\/[^\s<>"')]+/g;
  let last = 0;
  for (const match of text.matchAll(pattern)) {
    const start = match.index;
    if (start > last) parts.push({ kind: 'text', value: text.slice(last, start) });
    parts.push({ kind: 'url', value: match[0] });
    last = start + match[0].length;
  }
  if (last < text.length) parts.push({ kind: 'text', value: text.slice(last) });
  return parts;
}
