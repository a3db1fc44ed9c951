import type { AttachmentContentType } from '@kilocycle/common/types';

/** What a file's first bytes say it is. */
export type SniffedContent = {
  /** One of the types attachments accept, or null. */
  contentType: AttachmentContentType | null;
  /** In words, for messages: "a PNG image", "UTF-8 text", "binary data". */
  description: string;
  /** True for UTF-8 (or ASCII) text without NUL bytes: what a CSV or TSV file must be. */
  text: boolean;
  /** Length of a UTF-8 byte-order mark at the start (3), else 0. */
  bomLength: number;
};

/** How many leading bytes to read before calling {@link sniffContent}. */
export const SNIFF_BYTES = 8192;

type Signature = { offset: number; bytes: Array<number | null>; contentType: AttachmentContentType | null; description: string };

const ascii = (text: string) => Array.from(text, (c) => c.charCodeAt(0));

// Magic numbers of the formats people are likely to send by mistake, and of the ones we keep.
const SIGNATURES: Signature[] = [
  { offset: 0, bytes: [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a], contentType: 'image/png', description: 'a PNG image' },
  { offset: 0, bytes: [0xff, 0xd8, 0xff], contentType: 'image/jpeg', description: 'a JPEG image' },
  { offset: 0, bytes: ascii('GIF87a'), contentType: 'image/gif', description: 'a GIF image' },
  { offset: 0, bytes: ascii('GIF89a'), contentType: 'image/gif', description: 'a GIF image' },
  { offset: 0, bytes: [...ascii('RIFF'), null, null, null, null, ...ascii('WEBP')], contentType: 'image/webp', description: 'a WebP image' },
  { offset: 0, bytes: ascii('%PDF-'), contentType: 'application/pdf', description: 'a PDF document' },
  { offset: 0, bytes: [0x50, 0x4b, 0x03, 0x04], contentType: null, description: 'a ZIP archive (an .xlsx, .ods or .docx file is one)' },
  { offset: 0, bytes: [0x50, 0x4b, 0x05, 0x06], contentType: null, description: 'a ZIP archive' },
  { offset: 0, bytes: [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1], contentType: null, description: 'an old Microsoft Office file (.xls or .doc)' },
  { offset: 0, bytes: [0x1f, 0x8b], contentType: null, description: 'a gzip archive' },
  { offset: 0, bytes: [0x37, 0x7a, 0xbc, 0xaf, 0x27, 0x1c], contentType: null, description: 'a 7-Zip archive' },
  { offset: 0, bytes: ascii('Rar!'), contentType: null, description: 'a RAR archive' },
  { offset: 0, bytes: [0x49, 0x49, 0x2a, 0x00], contentType: null, description: 'a TIFF image' },
  { offset: 0, bytes: [0x4d, 0x4d, 0x00, 0x2a], contentType: null, description: 'a TIFF image' },
  { offset: 4, bytes: ascii('ftyp'), contentType: null, description: 'an HEIC photo or MP4 video' },
  { offset: 0, bytes: [0x7f, 0x45, 0x4c, 0x46], contentType: null, description: 'a program (ELF)' },
  { offset: 0, bytes: ascii('SQLite format 3'), contentType: null, description: 'an SQLite database' },
  { offset: 0, bytes: [0xff, 0xfe], contentType: null, description: 'UTF-16 text (save it as UTF-8)' },
  { offset: 0, bytes: [0xfe, 0xff], contentType: null, description: 'UTF-16 text (save it as UTF-8)' },
];

function matches(head: Uint8Array, signature: Signature): boolean {
  if (head.length < signature.offset + signature.bytes.length) return false;
  return signature.bytes.every((byte, i) => byte === null || head[signature.offset + i] === byte);
}

/**
 * Says what a file is from its first bytes (read {@link SNIFF_BYTES} of them), never from its name or
 * the type the browser declared: magic numbers for the images and documents we keep and for common
 * look-alikes, else UTF-8 text when the bytes decode as UTF-8 with no NUL and under 1 % other control
 * characters, else binary data.
 */
export function sniffContent(head: Uint8Array): SniffedContent {
  if (head.length === 0) return { contentType: null, description: 'an empty file', text: false, bomLength: 0 };
  for (const signature of SIGNATURES) {
    if (matches(head, signature)) return { contentType: signature.contentType, description: signature.description, text: false, bomLength: 0 };
  }
  const bomLength = head.length >= 3 && head[0] === 0xef && head[1] === 0xbb && head[2] === 0xbf ? 3 : 0;
  let controls = 0;
  for (let i = bomLength; i < head.length; i++) {
    const byte = head[i]!;
    if (byte === 0) return { contentType: null, description: 'binary data', text: false, bomLength: 0 };
    if ((byte < 0x20 && byte !== 0x09 && byte !== 0x0a && byte !== 0x0d && byte !== 0x0c) || byte === 0x7f) controls++;
  }
  if (controls > 0.01 * head.length) return { contentType: null, description: 'binary data', text: false, bomLength: 0 };
  try {
    // stream: true leaves a character cut off at the end of the sample unchecked instead of refusing it.
    new TextDecoder('utf-8', { fatal: true }).decode(head.subarray(bomLength), { stream: true });
  } catch {
    return { contentType: null, description: 'text that is not UTF-8 (save it as UTF-8)', text: false, bomLength: 0 };
  }
  return { contentType: 'text/plain', description: 'UTF-8 text', text: true, bomLength };
}
