/**
 * Control characters a single line of text must not hold: C0 (U+0000–U+001F, with TAB, LF and CR), DEL
 * (U+007F), C1 (U+0080–U+009F, with NEL) and the Unicode line and paragraph separators (U+2028, U+2029).
 * Any of them in a name, serial or label can break a printed line or fake a line of its own on a certificate.
 */
export const CONTROL_CHARACTER = /[\u0000-\u001f\u007f-\u009f\u2028\u2029]/;

const CONTROL_CHARACTERS = /[\u0000-\u001f\u007f-\u009f\u2028\u2029]/g;
/** Line ends in any convention: CR LF, CR, LF, VT, FF, NEL, LS, PS. */
const LINE_BREAKS = /\r\n|[\r\n\v\f\u0085\u2028\u2029]/g;

/**
 * Whether a text is one line without control characters (the rule for names, makes, models, serials,
 * asset tags, labels, numbers and e-mail addresses).
 *
 * @param value the text
 * @returns true when it holds none of {@link CONTROL_CHARACTER}
 * @example isSingleLineText('HR 3318L'); // => true
 * @example isSingleLineText('SN 1234\r\nPASS'); // => false
 */
export function isSingleLineText(value: string): boolean {
  return !CONTROL_CHARACTER.test(value);
}

/**
 * The refusal of a text that is not a single line, naming the field.
 *
 * @example singleLineMessage('serial'); // => 'serial must be a single line of text without control characters'
 */
export function singleLineMessage(field: string): string {
  return `${field} must be a single line of text without control characters`;
}

/**
 * A text made safe to print where one line is printed (a table cell, a header, a subject line): every line
 * break and tab becomes one space, other control characters are dropped, runs of spaces so made are
 * joined and the ends trimmed.
 *
 * @example printableLine('Signal\r\ngenerator\tmk II\u0007'); // => 'Signal generator mk II'
 */
export function printableLine(text: string): string {
  return text.replace(LINE_BREAKS, ' ').replace(/\t/g, ' ').replace(CONTROL_CHARACTERS, '').replace(/ {2,}/g, ' ').trim();
}

/**
 * A multi-line text (notes, condition as received, method, reasons, addresses) made safe to print: line
 * ends of every convention become LF, tabs a space, other control characters are dropped, spaces at line
 * ends go, at most one empty line is kept between paragraphs, and the ends are trimmed.
 *
 * @example printableText('Dial cord slips.\r\n\r\n\r\n\r\nCase cracked.\u001b[2J'); // => 'Dial cord slips.\n\nCase cracked.[2J'
 */
export function printableText(text: string): string {
  return text
    .replace(LINE_BREAKS, '\n')
    .replace(/\t/g, ' ')
    .replace(/[\u0000-\u0009\u000b-\u001f\u007f-\u009f]/g, '')
    .replace(/[ ]+\n/g, '\n')
    .replace(/\n{3,}/g, '\n\n')
    .trim();
}
