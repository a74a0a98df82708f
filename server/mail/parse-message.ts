/**
 * A small reader for the MIME messages our own mailer sends (RFC 5322 headers, RFC 2045 transfer
 * encodings, RFC 2046 multipart, RFC 2047 encoded words): enough to show them in the Outbox.
 */
export interface ParsedMail {
  from: string;
  to: string;
  subject: string;
  text: string;
  html: string;
}

interface Part {
  headers: Map<string, string>;
  body: string;
}

function splitPart(raw: string): Part {
  const normalized = raw.replace(/\r\n/g, '\n');
  const end = normalized.indexOf('\n\n');
  const head = end === -1 ? normalized : normalized.slice(0, end);
  const body = end === -1 ? '' : normalized.slice(end + 2);
  const headers = new Map<string, string>();
  // Folded header lines start with white space and continue the previous header (RFC 5322 §2.2.3).
  for (const line of head.replace(/\n[ \t]+/g, ' ').split('\n')) {
    const colon = line.indexOf(':');
    if (colon > 0) headers.set(line.slice(0, colon).trim().toLowerCase(), line.slice(colon + 1).trim());
  }
  return { headers, body };
}

function headerParam(value: string, name: string): string | undefined {
  const match = new RegExp(`;\\s*${name}=(?:"([^"]*)"|([^;\\s]+))`, 'i').exec(value);
  return match ? (match[1] ?? match[2]) : undefined;
}

function bytesOfQuotedPrintable(text: string): Uint8Array {
  const joined = text.replace(/=\r?\n/g, '');
  const bytes: number[] = [];
  for (let i = 0; i < joined.length; i += 1) {
    const hex = joined.slice(i + 1, i + 3);
    if (joined[i] === '=' && /^[0-9A-Fa-f]{2}$/.test(hex)) {
      bytes.push(Number.parseInt(hex, 16));
      i += 2;
    } else {
      bytes.push(...new TextEncoder().encode(joined[i]));
    }
  }
  return Uint8Array.from(bytes);
}

function decodeBytes(bytes: Uint8Array, charset = 'utf-8'): string {
  try {
    return new TextDecoder(charset).decode(bytes);
  } catch {
    return new TextDecoder('utf-8').decode(bytes);
  }
}

function decodeBody(part: Part): string {
  const encoding = (part.headers.get('content-transfer-encoding') ?? '7bit').toLowerCase();
  const charset = headerParam(part.headers.get('content-type') ?? '', 'charset');
  if (encoding === 'base64') return decodeBytes(Buffer.from(part.body.replace(/\s+/g, ''), 'base64'), charset);
  if (encoding === 'quoted-printable') return decodeBytes(bytesOfQuotedPrintable(part.body), charset);
  return part.body;
}

/** RFC 2047 encoded words such as `=?UTF-8?Q?Caf=C3=A9?=` in Subject and address headers. */
export function decodeWords(value: string): string {
  return value.replace(/(=\?[^?]+\?[BbQq]\?[^?]*\?=)\s+(?==\?)/g, '$1').replace(/=\?([^?]+)\?([BbQq])\?([^?]*)\?=/g, (_all, charset: string, kind: string, data: string) => {
    if (kind.toUpperCase() === 'B') return decodeBytes(Buffer.from(data, 'base64'), charset);
    return decodeBytes(bytesOfQuotedPrintable(data.replace(/_/g, ' ')), charset);
  });
}

function collect(part: Part, found: { text?: string; html?: string }): void {
  const type = part.headers.get('content-type') ?? 'text/plain';
  const mediaType = type.split(';')[0]!.trim().toLowerCase();
  if (mediaType.startsWith('multipart/')) {
    const boundary = headerParam(type, 'boundary');
    if (!boundary) return;
    const sections = part.body.replace(/\r\n/g, '\n').split(`--${boundary}`);
    // The first section is the preamble and the one after the closing `--boundary--` the epilogue.
    for (const section of sections.slice(1)) {
      if (section.startsWith('--')) break;
      collect(splitPart(section.replace(/^\n/, '')), found);
    }
    return;
  }
  const disposition = part.headers.get('content-disposition') ?? '';
  if (disposition.toLowerCase().startsWith('attachment')) return;
  const body = decodeBody(part).replace(/\n$/, '');
  if (mediaType === 'text/plain' && found.text === undefined) found.text = body;
  if (mediaType === 'text/html' && found.html === undefined) found.html = body;
}

export function parseMessage(raw: string): ParsedMail {
  const root = splitPart(raw);
  const found: { text?: string; html?: string } = {};
  collect(root, found);
  return {
    from: decodeWords(root.headers.get('from') ?? ''),
    to: decodeWords(root.headers.get('to') ?? ''),
    subject: decodeWords(root.headers.get('subject') ?? ''),
    text: found.text ?? '',
    html: found.html ?? '',
  };
}
