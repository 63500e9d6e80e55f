/**
 * Just enough MIME (RFC 2045–2047) to read the messages the development sink receives: headers with
 * folding and encoded words, multipart bodies, quoted-printable and base64 parts, UTF-8 text.
 */
export interface ParsedMail {
  headers: Map<string, string>;
  text: string;
  html: string | null;
}

function splitHeadAndBody(raw: string): [string, string] {
  const match = /\r?\n\r?\n/.exec(raw);
  if (!match) return [raw, ''];
  return [raw.slice(0, match.index), raw.slice(match.index + match[0].length)];
}

export function parseHeaders(head: string): Map<string, string> {
  const headers = new Map<string, string>();
  // Unfold: a line starting with white space continues the previous one (RFC 5322 §2.2.3).
  const unfolded = head.replace(/\r?\n[ \t]+/g, ' ');
  for (const line of unfolded.split(/\r?\n/)) {
    const colon = line.indexOf(':');
    if (colon <= 0) continue;
    const name = line.slice(0, colon).trim().toLowerCase();
    if (!headers.has(name)) headers.set(name, line.slice(colon + 1).trim());
  }
  return headers;
}

function charsetDecode(bytes: Buffer, charset: string): string {
  try {
    return new TextDecoder(charset || 'utf-8').decode(bytes);
  } catch {
    return bytes.toString('latin1');
  }
}

function quotedPrintableBytes(input: string): Buffer {
  const soft = input.replace(/=\r?\n/g, '');
  const bytes: number[] = [];
  for (let i = 0; i < soft.length; i++) {
    const c = soft[i]!;
    const hex = soft.slice(i + 1, i + 3);
    if (c === '=' && /^[0-9A-Fa-f]{2}$/.test(hex)) {
      bytes.push(parseInt(hex, 16));
      i += 2;
    } else bytes.push(c.charCodeAt(0) & 0xff);
  }
  return Buffer.from(bytes);
}

/**
 * A header value as people read it: raw 8-bit text taken as UTF-8, and `=?utf-8?Q?…?=` /
 * `=?utf-8?B?…?=` words decoded (RFC 2047). The message is read byte for byte (latin1).
 */
export function decodeHeaderValue(value: string): string {
  return Buffer.from(value, 'latin1')
    .toString('utf8')
    .replace(/\?=\s+=\?/g, '?==?')
    .replace(/=\?([^?]+)\?([BbQq])\?([^?]*)\?=/g, (_all, charset: string, encoding: string, data: string) => {
      const bytes = encoding.toUpperCase() === 'B' ? Buffer.from(data, 'base64') : quotedPrintableBytes(data.replace(/_/g, ' '));
      return charsetDecode(bytes, charset);
    });
}

function parameter(header: string, name: string): string | null {
  const match = new RegExp(`${name}\\s*=\\s*(?:"([^"]*)"|([^;\\s]+))`, 'i').exec(header);
  return match ? (match[1] ?? match[2] ?? null) : null;
}

function decodeBody(body: string, headers: Map<string, string>): string {
  const encoding = (headers.get('content-transfer-encoding') ?? '7bit').toLowerCase();
  const charset = parameter(headers.get('content-type') ?? '', 'charset') ?? 'utf-8';
  const bytes =
    encoding === 'base64' ? Buffer.from(body.replace(/\s+/g, ''), 'base64') : encoding === 'quoted-printable' ? quotedPrintableBytes(body) : Buffer.from(body, 'binary');
  return charsetDecode(bytes, charset);
}

function walk(raw: string, out: { text: string | null; html: string | null }): void {
  const [head, body] = splitHeadAndBody(raw);
  const headers = parseHeaders(head);
  const type = (headers.get('content-type') ?? 'text/plain').toLowerCase();
  if (type.startsWith('multipart/')) {
    const boundary = parameter(headers.get('content-type') ?? '', 'boundary');
    if (!boundary) return;
    const parts = body.split(new RegExp(`\\r?\\n?--${boundary.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}(?:--)?[ \\t]*\\r?\\n?`));
    for (const part of parts.slice(1)) if (part.trim()) walk(part, out);
    return;
  }
  // The line break before the next boundary or the end of the message belongs to the framing.
  const content = body.replace(/\r?\n$/, '');
  if (type.startsWith('text/html')) out.html ??= decodeBody(content, headers);
  else if (type.startsWith('text/')) out.text ??= decodeBody(content, headers);
}

export function parseMail(raw: string): ParsedMail {
  const [head] = splitHeadAndBody(raw);
  const headers = parseHeaders(head);
  const out: { text: string | null; html: string | null } = { text: null, html: null };
  walk(raw, out);
  return { headers, text: (out.text ?? '').replace(/\r\n/g, '\n'), html: out.html };
}
