import { describe, it, expect } from 'vitest';
import { decodeText, decodingStream, textEncodingOf } from '@server/lib/text-encoding';

// What meter software and spreadsheets write (common practice, from memory): UTF-8 with or
// without a byte-order mark; "Unicode text" as UTF-16 little-endian with a mark; Western
// European Windows programs' "ANSI" CSV as Windows-1252. The files here are encoded
// independently of the code under test: UTF-16 by Node's Buffer, Windows-1252 byte by byte from
// the Unicode Consortium's mapping table cp1252.txt (also the WHATWG Encoding Standard's
// index-windows-1252), of which the bytes used are listed in CP1252.
const LINE = 'timestamp;probe;point;note\n2026-11-01T08:00:00Z;LX-1;Büro 2.04;Lüfter defekt, 5 € Ersatzteil — “später” Ÿ\n';
const CP1252: Record<string, number> = { '€': 0x80, '“': 0x93, '”': 0x94, '—': 0x97, 'Ÿ': 0x9f, 'ä': 0xe4, 'ü': 0xfc };
const ansiOf = (text: string) => Buffer.from([...text].map((ch) => CP1252[ch] ?? ch.charCodeAt(0)));
const utf16be = (text: string) => Buffer.from(text, 'utf16le').swap16();

describe('the encoding of an uploaded text file', () => {
  it('is UTF-8 for UTF-8 text, with or without a byte-order mark, and even when the read cut a character in two', () => {
    const utf8 = Buffer.from(LINE, 'utf8');
    expect(textEncodingOf(utf8)).toBe('utf-8');
    expect(textEncodingOf(Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), utf8]))).toBe('utf-8');
    const cut = utf8.subarray(0, utf8.indexOf(Buffer.from('ü')) + 1); // the first byte of ü only
    expect(textEncodingOf(cut)).toBe('utf-8');
    expect(decodeText(Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), utf8]), 'utf-8')).toBe(LINE);
  });

  it('is Windows-1252 for an "ANSI" file, and € 0x80, “ 0x93, — 0x97, Ÿ 0x9F decode as cp1252.txt maps them (not as Latin-1 controls)', () => {
    expect([...LINE].filter((ch) => ch.charCodeAt(0) >= 0x80 && !(ch in CP1252))).toEqual([]);
    const ansi = ansiOf(LINE);
    expect(textEncodingOf(ansi)).toBe('windows-1252');
    expect(decodeText(ansi, 'windows-1252')).toBe(LINE);
    expect(decodeText(Buffer.from([0x80, 0x93, 0x97, 0x9f]), 'windows-1252')).toBe('\u20ac\u201c\u2014\u0178');
  });

  it('is UTF-16 for "Unicode text", by its mark or, without one, by the zero bytes of ASCII', () => {
    const le = Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(LINE, 'utf16le')]);
    const be = Buffer.concat([Buffer.from([0xfe, 0xff]), utf16be(LINE)]);
    expect(textEncodingOf(le)).toBe('utf-16le');
    expect(textEncodingOf(be)).toBe('utf-16be');
    expect(textEncodingOf(Buffer.from(LINE, 'utf16le'))).toBe('utf-16le');
    expect(textEncodingOf(Buffer.from(`\uFEFF${LINE}😀 Lux ☀\n`, 'utf16le'))).toBe('utf-16le'); // a surrogate pair is text
    expect(textEncodingOf(utf16be(LINE))).toBe('utf-16be');
    expect(decodeText(le, 'utf-16le')).toBe(LINE);
    expect(decodeText(be, 'utf-16be')).toBe(LINE);
  });

  it('is none for binary data: an image, zero bytes out of pattern, stray controls, or bytes Windows-1252 leaves undefined', () => {
    const png = Buffer.from('89504e470d0a1a0a0000000d4948445200000001000000010806000000', 'hex');
    expect(textEncodingOf(png)).toBeNull();
    expect(textEncodingOf(Buffer.from([0x41, 0x00, 0x00, 0x42, 0x43, 0x00, 0x44, 0x45]))).toBeNull();
    expect(textEncodingOf(Buffer.from('a,b\x01,c\n', 'latin1'))).toBeNull();
    expect(textEncodingOf(Buffer.from([0x61, 0x2c, 0x81, 0x0a]))).toBeNull();
    // FF FE also starts an MPEG audio frame: a mark followed by binary data is not text.
    let seed = 5;
    const noise = Buffer.from(Array.from({ length: 4096 }, () => (seed = (seed * 1103515245 + 12345) >>> 0) >>> 24));
    expect(textEncodingOf(Buffer.concat([Buffer.from([0xff, 0xfe]), noise]))).toBeNull();
  });

  it('decodes a stream whose chunks split characters (a UTF-16 pair, a Windows-1252 file in one-byte chunks) to the same text', async () => {
    for (const [encoding, bytes] of [['utf-16le', Buffer.from(`\uFEFF${LINE}😀`, 'utf16le')], ['windows-1252', ansiOf(LINE)]] as const) {
      const stream = decodingStream(encoding);
      let text = '';
      stream.on('data', (d: string) => { text += d; });
      const ended = new Promise((r) => stream.on('end', r));
      for (let i = 0; i < bytes.length; i += 3) stream.write(bytes.subarray(i, i + 3));
      stream.end();
      await ended;
      expect(text).toBe(encoding === 'utf-16le' ? `${LINE}😀` : LINE);
    }
  });
});
