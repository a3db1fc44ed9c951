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
