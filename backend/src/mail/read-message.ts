import libmime from 'libmime';
import { simpleParser } from 'mailparser';

/** A captured message as the outbox shows it: headers (decoded), text and HTML parts, attachments. */
export type ParsedPart = { contentType: string; filename: string | null; body: Buffer };
export type ParsedMessage = {
  headers: Array<{ name: string; value: string }>;
  subject: string;
  messageId: string | null;
  kind: string;
  text: string | null;
  html: string | null;
  attachments: ParsedPart[];
};

/** `Name: value` as written, unfolded, its RFC 2047 encoded words decoded (libmime, mailparser's own decoder). */
function headerOf(line: string): { name: string; value: string } {
  const colon = line.indexOf(':');
  const name = line.slice(0, colon).trim();
  const value = line
    .slice(colon + 1)
    .replace(/\r?\n[ \t]+/g, ' ')
    .trim();
  return { name, value: libmime.decodeWords(value) };
}

/**
 * Reads a raw RFC 5322 message with mailparser. Never throws on odd input: a body it cannot read leaves the headers,
 * and text that is not a message comes back empty. The HTML is only a real `text/html` part (`skipTextToHtml`: no
 * HTML made up from the text), as the message was sent.
 */
export async function parseMessage(raw: string): Promise<ParsedMessage> {
  const parsed = await simpleParser(raw, { skipTextToHtml: true, skipImageLinks: true, checksumAlgo: false }).catch(() => null);
  if (!parsed) return { headers: [], subject: '', messageId: null, kind: 'other', text: null, html: null, attachments: [] };
  const headers = parsed.headerLines.filter((h) => h.line.includes(':')).map((h) => headerOf(h.line));
  const header = (name: string) => headers.find((h) => h.name.toLowerCase() === name.toLowerCase())?.value ?? null;
  return {
    headers,
    subject: parsed.subject ?? '',
    messageId: parsed.messageId ?? null,
    kind: header('X-Kilocycle-Kind') ?? 'other',
    text: parsed.text ?? null,
    html: typeof parsed.html === 'string' ? parsed.html : null,
    attachments: parsed.attachments.map((a) => ({ contentType: a.contentType, filename: a.filename ?? null, body: a.content })),
  };
}
