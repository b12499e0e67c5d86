/**
 * Just enough RFC 5322 / MIME reading for the development mail catcher and the tests: headers
 * (unfolded, RFC 2047 encoded words decoded), addresses, and the text/plain body (7bit, 8bit,
 * quoted-printable or base64; the first text/plain part of a multipart message).
 */

export interface ParsedMail {
  headers: Map<string, string>;
  subject: string;
  from: string;
  /** Addresses from To and Cc, lower-cased. */
  to: string[];
  text: string;
}

function decoder(charset: string | undefined): TextDecoder {
  try {
    return new TextDecoder(charset || 'utf-8');
  } catch {
    return new TextDecoder('utf-8');
  }
}

function decodeQuotedPrintable(s: string): Buffer {
  const soft = s.replace(/=\r?\n/g, '');
  const bytes: number[] = [];
  for (let i = 0; i < soft.length; i++) {
    const c = soft[i]!;
    if (c === '=' && /^[0-9A-Fa-f]{2}$/.test(soft.slice(i + 1, i + 3))) {
      bytes.push(parseInt(soft.slice(i + 1, i + 3), 16));
      i += 2;
    } else {
      for (const b of Buffer.from(c, 'latin1')) bytes.push(b);
    }
  }
  return Buffer.from(bytes);
}

/** Decode `=?charset?B|Q?…?=` words in a header value. */
export function decodeEncodedWords(value: string): string {
  return value
    .replace(/(=\?[^?]+\?[BbQq]\?[^?]*\?=)\s+(?==\?)/g, '$1')
    .replace(
      /=\?([^?]+)\?([BbQq])\?([^?]*)\?=/g,
      (_m, charset: string, enc: string, data: string) => {
        const bytes =
          enc.toUpperCase() === 'B'
            ? Buffer.from(data, 'base64')
            : decodeQuotedPrintable(data.replace(/_/g, ' '));
        return decoder(charset.split('*')[0]).decode(bytes);
      },
    );
}

function splitHead(raw: string): { head: string; body: string } {
  const m = /\r?\n\r?\n/.exec(raw);
  if (!m) return { head: raw, body: '' };
  return { head: raw.slice(0, m.index), body: raw.slice(m.index + m[0].length) };
}

function parseHeaders(head: string): Map<string, string> {
  const headers = new Map<string, string>();
  for (const line of head.replace(/\r?\n[ \t]+/g, ' ').split(/\r?\n/)) {
    const i = line.indexOf(':');
    if (i <= 0) continue;
    const name = line.slice(0, i).trim().toLowerCase();
    const value = line.slice(i + 1).trim();
    headers.set(name, headers.has(name) ? `${headers.get(name)}, ${value}` : value);
  }
  return headers;
}

function param(header: string | undefined, name: string): string | undefined {
  if (!header) return undefined;
  const m = new RegExp(`;\\s*${name}\\s*=\\s*(?:"([^"]*)"|([^;\\s]*))`, 'i').exec(header);
  return m ? (m[1] ?? m[2]) : undefined;
}

/** Addresses in an address-list header (`Name <a@b>, c@d`), lower-cased. */
export function parseAddresses(value: string | undefined): string[] {
  if (!value) return [];
  const out: string[] = [];
  for (const m of value.matchAll(/<([^<>\s]+@[^<>\s]+)>|([^\s,<>"]+@[^\s,<>"]+)/g))
    out.push((m[1] ?? m[2] ?? '').toLowerCase());
  return out;
}

function decodeBody(body: string, headers: Map<string, string>): string {
  const cte = (headers.get('content-transfer-encoding') ?? '7bit').toLowerCase();
  const charset = param(headers.get('content-type'), 'charset');
  let bytes: Buffer;
  if (cte === 'base64') bytes = Buffer.from(body.replace(/\s+/g, ''), 'base64');
  else if (cte === 'quoted-printable') bytes = decodeQuotedPrintable(body);
  else bytes = Buffer.from(body, 'latin1');
  return decoder(charset).decode(bytes).replace(/\r\n/g, '\n');
}

function findText(raw: string, headers: Map<string, string>, depth = 0): string {
  const type = (headers.get('content-type') ?? 'text/plain').toLowerCase();
  if (type.startsWith('multipart/') && depth < 5) {
    const boundary = param(headers.get('content-type'), 'boundary');
    if (!boundary) return '';
    const parts = raw.split(`--${boundary}`).slice(1);
    for (const part of parts) {
      if (part.startsWith('--')) break;
      const { head, body } = splitHead(part.replace(/^\r?\n/, ''));
      const h = parseHeaders(head);
      const text = findText(body.replace(/\r?\n$/, ''), h, depth + 1);
      if (text) return text;
    }
    return '';
  }
  if (type.startsWith('text/plain')) return decodeBody(raw, headers);
  return '';
}

/** Read a whole message as received over SMTP or kept in an .eml file. */
export function parseMail(raw: Buffer | string): ParsedMail {
  const text = typeof raw === 'string' ? raw : raw.toString('latin1');
  const { head, body } = splitHead(text);
  const headers = parseHeaders(head);
  return {
    headers,
    subject: decodeEncodedWords(headers.get('subject') ?? ''),
    from: decodeEncodedWords(headers.get('from') ?? ''),
    to: [...parseAddresses(headers.get('to')), ...parseAddresses(headers.get('cc'))],
    text: findText(body, headers),
  };
}
