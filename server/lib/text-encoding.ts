import fs from 'node:fs';
import { Transform } from 'node:stream';
import iconv from 'iconv-lite';

/**
 * The encodings a text file from a meter's software or a spreadsheet arrives in: UTF-8 (with or
 * without a byte-order mark), UTF-16 (a spreadsheet's "Unicode text", usually with a mark), and
 * Windows-1252 (a Western European Windows program's "ANSI" CSV). Decoding is iconv-lite's (it
 * drops a byte-order mark): Node's TextDecoder reads "windows-1252" as Latin-1, turning € and the
 * curly quotes into control characters.
 */
export type TextEncoding = 'utf-8' | 'utf-16le' | 'utf-16be' | 'windows-1252';
const ICONV_NAMES: Record<TextEncoding, string> = { 'utf-8': 'utf8', 'utf-16le': 'utf16le', 'utf-16be': 'utf16be', 'windows-1252': 'win1252' };

export const TEXT_ENCODING_NAMES: Record<TextEncoding, string> = {
  'utf-8': 'UTF-8', 'utf-16le': 'UTF-16 (little-endian)', 'utf-16be': 'UTF-16 (big-endian)', 'windows-1252': 'Windows-1252 (Western European)',
};

/** How much of a file decides its encoding (textEncodingOfFile). */
export const TEXT_HEAD_BYTES = 64 * 1024;

/** Whether the bytes are UTF-8, allowing a character cut at the end (a prefix read from a longer file). */
function isUtf8Prefix(bytes: Uint8Array): boolean {
  try {
    // Streaming: a sequence left incomplete at the end waits for more bytes instead of failing.
    new TextDecoder('utf-8', { fatal: true }).decode(bytes, { stream: true });
    return true;
  } catch {
    return false;
  }
}

/** C0 controls other than tab, line feed, form feed and carriage return: text files have none. */
const isStrayControl = (b: number) => b < 0x20 && b !== 0x09 && b !== 0x0a && b !== 0x0c && b !== 0x0d;
/** Bytes Windows-1252 leaves undefined (WHATWG maps them to C1 controls): not in real text. */
const UNDEFINED_IN_1252 = new Set([0x81, 0x8d, 0x8f, 0x90, 0x9d]);

/**
 * The encoding of a text file from its first bytes, or null when they are not text. A mark
 * decides UTF-16; without one, zero bytes in every other place (ASCII in UTF-16) do. Bytes that
 * are valid UTF-8 are UTF-8; other bytes with no stray control are read as Windows-1252.
 */
export function textEncodingOf(head: Uint8Array): TextEncoding | null {
  const utf16 = utf16Of(head);
  if (utf16 !== undefined) {
    // Whole code units only, and the last one left out: it may be half of a pair the read cut.
    const units = head.subarray(0, Math.max(2, head.length - 2) & ~1);
    return utf16 !== null && isPlainText(decodeText(units, utf16)) ? utf16 : null;
  }
  if (head.some(isStrayControl)) return null;
  if (isUtf8Prefix(head)) return 'utf-8';
  return head.some((b) => UNDEFINED_IN_1252.has(b)) ? null : 'windows-1252';
}

/** UTF-16 by its mark or its zero bytes; null for zero bytes in no such pattern (binary); undefined when there are no zero bytes and no mark. */
function utf16Of(head: Uint8Array): 'utf-16le' | 'utf-16be' | null | undefined {
  if (head[0] === 0xff && head[1] === 0xfe) return 'utf-16le';
  if (head[0] === 0xfe && head[1] === 0xff) return 'utf-16be';
  if (head.includes(0)) {
    const pairs = Math.floor(Math.min(head.length, 4096) / 2);
    let zeroOdd = 0;
    let zeroEven = 0;
    for (let i = 0; i < pairs; i++) {
      if (head[2 * i] === 0) zeroEven++;
      if (head[2 * i + 1] === 0) zeroOdd++;
    }
    if (pairs >= 2 && zeroOdd >= 0.9 * pairs && zeroEven === 0) return 'utf-16le';
    if (pairs >= 2 && zeroEven >= 0.9 * pairs && zeroOdd === 0) return 'utf-16be';
    return null;
  }
  return undefined;
}

/**
 * Decoded text with no stray control, NUL, replacement character or half of a surrogate pair (one
 * cut off at the end aside): binary data that starts like a mark (an MPEG frame) fails this.
 */
function isPlainText(text: string): boolean {
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 0xfffd || isStrayControl(c)) return false;
    if (c >= 0xd800 && c <= 0xdbff) {
      const next = text.charCodeAt(i + 1);
      if (i + 1 < text.length && !(next >= 0xdc00 && next <= 0xdfff)) return false;
      i++;
    } else if (c >= 0xdc00 && c <= 0xdfff) return false;
  }
  return true;
}

/** The encoding of a text file from its first TEXT_HEAD_BYTES, or null when it is not text. */
export function textEncodingOfFile(filePath: string): TextEncoding | null {
  const fd = fs.openSync(filePath, 'r');
  try {
    const head = Buffer.alloc(TEXT_HEAD_BYTES);
    const n = fs.readSync(fd, head, 0, head.length, 0);
    return textEncodingOf(head.subarray(0, n));
  } finally {
    fs.closeSync(fd);
  }
}

/** A whole file's bytes as text in their encoding (a byte-order mark dropped). */
export function decodeText(bytes: Uint8Array, encoding: TextEncoding): string {
  return iconv.decode(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength), ICONV_NAMES[encoding]);
}

/** A stream of the file's bytes as text: characters split across chunks are joined, a byte-order mark dropped. */
export function decodingStream(encoding: TextEncoding): Transform {
  const decoder = iconv.getDecoder(ICONV_NAMES[encoding]);
  const stream = new Transform({
    transform(chunk: Buffer, _enc, done) { done(null, decoder.write(chunk)); },
    flush(done) { done(null, decoder.end() ?? ''); },
  });
  return stream.setEncoding('utf8');
}
