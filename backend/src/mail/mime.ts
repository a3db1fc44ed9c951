/** A small reader for the messages nodemailer writes: headers, text and HTML parts, attachments. */

export type ParsedPart = { headers: Array<{ name: string; value: string }>; contentType: string; filename: string | null; body: Buffer };
export type ParsedMessage = {
  headers: Array<{ name: string; value: string }>;
  subject: string;
  messageId: string | null;
  kind: string;
  text: string | null;
  html: string | null;
  attachments: ParsedPart[];
};

function splitHeadersBody(raw: string): { head: string; body: string } {
  const match = /\r?\n\r?\n/.exec(raw);
  if (!match) return { head: raw, body: '' };
  return { head: raw.slice(0, match.index), body: raw.slice(match.index + match[0].length) };
}

function parseHeaders(head: string): Array<{ name: string; value: string }> {
  const unfolded = head.replace(/\r?\n[ \t]+/g, ' ');
  return unfolded
    .split(/\r?\n/)
    .map((line) => {
      const colon = line.indexOf(':');
      return colon <= 0 ? null : { name: line.slice(0, colon).trim(), value: line.slice(colon + 1).trim() };
    })
    .filter((h): h is { name: string; value: string } => h !== null);
}

/** RFC 2047 encoded words (=?UTF-8?B?…?= and =?UTF-8?Q?…?=), as nodemailer writes non-ASCII headers. */
export function decodeWords(value: string): string {
  return value
    .replace(/\?=\s+=\?/g, '?==?')
    .replace(/=\?([^?]+)\?([BbQq])\?([^?]*)\?=/g, (_all, _charset: string, encoding: string, text: string) => {
      if (encoding.toUpperCase() === 'B') return Buffer.from(text, 'base64').toString('utf8');
      const bytes = text.replace(/_/g, ' ').replace(/=([0-9A-Fa-f]{2})/g, (_m, hex: string) => String.fromCharCode(parseInt(hex, 16)));
      return Buffer.from(bytes, 'latin1').toString('utf8');
    });
}

function header(headers: Array<{ name: string; value: string }>, name: string): string | null {
  return headers.find((h) => h.name.toLowerCase() === name.toLowerCase())?.value ?? null;
}

function param(value: string | null, key: string): string | null {
  if (!value) return null;
  const match = new RegExp(`${key}\\*?=(?:"([^"]*)"|([^;\\s]*))`, 'i').exec(value);
  if (!match) return null;
  const found = match[1] ?? match[2] ?? '';
  // RFC 2231 extended value: utf-8''name%20with%20spaces
  const extended = /^([\w-]+)''(.*)$/.exec(found);
  return extended ? decodeURIComponent(extended[2]!) : decodeWords(found);
}

function decodeBody(body: string, encoding: string | null): Buffer {
  switch ((encoding ?? '7bit').toLowerCase()) {
    case 'base64':
      return Buffer.from(body.replace(/\s+/g, ''), 'base64');
    case 'quoted-printable': {
      const text = body.replace(/=\r?\n/g, '');
      const bytes: number[] = [];
      for (let i = 0; i < text.length; i++) {
        if (text[i] === '=' && /^[0-9A-Fa-f]{2}$/.test(text.slice(i + 1, i + 3))) {
          bytes.push(parseInt(text.slice(i + 1, i + 3), 16));
          i += 2;
        } else {
          bytes.push(text.charCodeAt(i) & 0xff);
        }
      }
      return Buffer.from(bytes);
    }
    default:
      return Buffer.from(body, 'utf8');
  }
}

function walk(raw: string, into: ParsedPart[]): void {
  const { head, body } = splitHeadersBody(raw);
  const headers = parseHeaders(head);
  const contentType = header(headers, 'Content-Type') ?? 'text/plain';
  const boundary = /^multipart\//i.test(contentType) ? param(contentType, 'boundary') : null;
  if (boundary) {
    const pieces = body.split(new RegExp(`\\r?\\n?--${boundary.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}(?:--)?[ \\t]*\\r?\\n?`));
    for (const piece of pieces.slice(1)) if (piece.trim() !== '') walk(piece, into);
    return;
  }
  const disposition = header(headers, 'Content-Disposition');
  into.push({
    headers,
    contentType: contentType.split(';')[0]!.trim().toLowerCase(),
    filename: param(disposition, 'filename') ?? param(contentType, 'name'),
    body: decodeBody(body, header(headers, 'Content-Transfer-Encoding')),
  });
}

/** Parses a raw RFC 5322 message; never throws on odd input (what it cannot read it leaves out). */
export function parseMessage(raw: string): ParsedMessage {
  const { head } = splitHeadersBody(raw);
  const headers = parseHeaders(head).map((h) => ({ name: h.name, value: decodeWords(h.value) }));
  const parts: ParsedPart[] = [];
  try {
    walk(raw, parts);
  } catch {
    // a malformed body still leaves the headers readable
  }
  const isAttachment = (p: ParsedPart) => /attachment/i.test(header(p.headers, 'Content-Disposition') ?? '') || (p.filename !== null && !p.contentType.startsWith('text/'));
  const text = parts.find((p) => p.contentType === 'text/plain' && !isAttachment(p));
  const html = parts.find((p) => p.contentType === 'text/html' && !isAttachment(p));
  return {
    headers,
    subject: header(headers, 'Subject') ?? '',
    messageId: header(headers, 'Message-ID'),
    kind: header(headers, 'X-Kilocycle-Kind') ?? 'other',
    text: text ? text.body.toString('utf8') : null,
    html: html ? html.body.toString('utf8') : null,
    attachments: parts.filter(isAttachment),
  };
}
