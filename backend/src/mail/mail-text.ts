import { printableLine, printableText } from '@kilocycle/common/text';

type Printable<T> = T;

function mapStrings(value: unknown, fn: (text: string) => string): unknown {
  if (typeof value === 'string') return fn(value);
  if (Array.isArray(value)) return value.map((item) => mapStrings(item, fn));
  if (value !== null && typeof value === 'object' && Object.getPrototypeOf(value) === Object.prototype) {
    return Object.fromEntries(Object.entries(value).map(([key, item]) => [key, mapStrings(item, fn)]));
  }
  return value; // numbers, Buffers (attachments)
}

/**
 * A template's values made safe to write into a plain-text e-mail: every text becomes one line (a make or
 * serial stored with CR/LF cannot add a line of its own, such as a fake link), except the named multi-line
 * fields (a return comment), which keep their line breaks; control characters go from all of them.
 */
export function printableMailInput<T extends Record<string, unknown>>(input: T, multiLine: ReadonlyArray<keyof T> = []): Printable<T> {
  return Object.fromEntries(
    Object.entries(input).map(([key, value]) => [key, mapStrings(value, multiLine.includes(key as keyof T) ? printableText : printableLine)]),
  ) as T;
}

const HTML_ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

/** Text for HTML: the five characters that could open markup or end an attribute, as entities. */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => HTML_ESCAPES[c]!);
}

/**
 * The HTML part of a mail, made from its plain text: every character escaped, paragraphs at blank lines,
 * line breaks kept, the "-- " signature line set apart. Only the links the template itself wrote (its own
 * URLs, passed in `links`) become anchors: a URL inside a stored value (a make, a comment) stays text, so
 * a customer's record cannot plant a clickable link in the lab's mail.
 */
export function mailTextToHtml(text: string, links: readonly string[] = []): string {
  const anchors = new Map(links.map((url) => [escapeHtml(url), `<a href="${escapeHtml(url)}">${escapeHtml(url)}</a>`]));
  const paragraph = (block: string) => {
    let html = escapeHtml(block);
    for (const [escaped, anchor] of anchors) html = html.split(escaped).join(anchor);
    return html.split('\n').join('<br>\n');
  };
  const [body, signature] = splitSignature(text);
  const paragraphs = body
    .split(/\n{2,}/)
    .filter((block) => block.trim() !== '')
    .map((block) => `<p style="margin:0 0 12px">${paragraph(block.replace(/^\n+|\n+$/g, ''))}</p>`);
  const footer =
    signature === null
      ? ''
      : `<hr style="border:0;border-top:1px solid #ccc;margin:16px 0 8px">\n<p style="margin:0;color:#555;font-size:13px">${paragraph(signature)}</p>`;
  return (
    '<!doctype html>\n<html><head><meta charset="utf-8"></head>\n' +
    `<body style="font-family:sans-serif;font-size:14px;line-height:1.45;color:#222">\n${paragraphs.join('\n')}\n${footer}\n</body></html>\n`
  );
}

/** The body and the signature after the conventional "-- " line (null when there is none). */
function splitSignature(text: string): [string, string | null] {
  const at = text.lastIndexOf('\n-- \n');
  return at < 0 ? [text, null] : [text.slice(0, at), text.slice(at + 5)];
}

/**
 * The mail's last lines, true to where a reply goes: with the lab's contact address the message carries it as
 * Reply-To and says so; without one, replies go to the sender, and a no-reply sender is said to be unread.
 */
export function mailSignOff(lab: { name: string; email: string | null }, fromAddress: string): string {
  const name = printableLine(lab.name);
  if (lab.email) return `\n\n-- \nSent by Kilocycle for ${name}. Replies to this message go to ${name} at ${lab.email}.`;
  if (/^no-?reply@/i.test(fromAddress)) return `\n\n-- \nSent by Kilocycle for ${name} from an address that is not read: to answer, contact ${name} directly.`;
  return `\n\n-- \nSent by Kilocycle for ${name}. Replies to this message go to ${fromAddress}.`;
}
