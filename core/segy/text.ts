/**
 * Textual headers: 3200 bytes = 40 cards of 80 characters, EBCDIC (code page 037) or ASCII.
 * Source: SEG-Y rev 1 §3 (textual header; ASCII allowed from rev 1), methods.md §6.8. The code page 037
 * table below was generated from Python's cp037 codec (CPython standard library).
 */

/** EBCDIC (cp037) byte -> Unicode code point. */
const EBCDIC_TO_CODE = new Uint16Array([0,1,2,3,156,9,134,127,151,141,142,11,12,13,14,15,16,17,18,19,157,133,8,135,24,25,146,143,28,29,30,31,128,129,130,131,132,10,23,27,136,137,138,139,140,5,6,7,144,145,22,147,148,149,150,4,152,153,154,155,20,21,158,26,32,160,226,228,224,225,227,229,231,241,162,46,60,40,43,124,38,233,234,235,232,237,238,239,236,223,33,36,42,41,59,172,45,47,194,196,192,193,195,197,199,209,166,44,37,95,62,63,248,201,202,203,200,205,206,207,204,96,58,35,64,39,61,34,216,97,98,99,100,101,102,103,104,105,171,187,240,253,254,177,176,106,107,108,109,110,111,112,113,114,170,186,230,184,198,164,181,126,115,116,117,118,119,120,121,122,161,191,208,221,222,174,94,163,165,183,169,167,182,188,189,190,91,93,175,168,180,215,123,65,66,67,68,69,70,71,72,73,173,244,246,242,243,245,125,74,75,76,77,78,79,80,81,82,185,251,252,249,250,255,92,247,83,84,85,86,87,88,89,90,178,212,214,210,211,213,48,49,50,51,52,53,54,55,56,57,179,219,220,217,218,159]);

/** Code point (< 256) -> EBCDIC byte; -1 when not representable. */
const CODE_TO_EBCDIC = new Int16Array(256).fill(-1);
for (let b = 0; b < 256; b++) if (EBCDIC_TO_CODE[b] < 256) CODE_TO_EBCDIC[EBCDIC_TO_CODE[b]] = b;

export type TextEncoding = 'ebcdic' | 'ascii';

export const CARD_CHARS = 80;
export const CARDS_PER_HEADER = 40;

function printableScore(bytes: Uint8Array, decode: (b: number) => number): number {
  let score = 0;
  for (let i = 0; i < bytes.length; i++) {
    const c = decode(bytes[i]);
    if ((c >= 0x41 && c <= 0x5a) || (c >= 0x61 && c <= 0x7a) || (c >= 0x30 && c <= 0x39) || c === 0x20) score++;
  }
  return score;
}

/**
 * Decide the encoding of a textual header by which reading gives more letters, digits and spaces
 * (a first byte 0xC3 / 0x43, "C" of "C 1", usually agrees; this also copes with headers that do not start with "C").
 */
export function detectTextEncoding(bytes: Uint8Array): TextEncoding {
  const e = printableScore(bytes, (b) => EBCDIC_TO_CODE[b]);
  const a = printableScore(bytes, (b) => b);
  return e > a ? 'ebcdic' : 'ascii';
}

/** Decode to a string; non-printable characters become spaces so cards can be shown safely. */
export function decodeText(bytes: Uint8Array, encoding: TextEncoding): string {
  let s = '';
  for (let i = 0; i < bytes.length; i++) {
    const c = encoding === 'ebcdic' ? EBCDIC_TO_CODE[bytes[i]] : bytes[i];
    s += c >= 0x20 && c !== 0x7f && !(c >= 0x80 && c < 0xa0) ? String.fromCharCode(c) : ' ';
  }
  return s;
}

/** Encode a string; characters outside the code page become '?'. */
export function encodeText(text: string, encoding: TextEncoding, out: Uint8Array, offset = 0): Uint8Array {
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    let b: number;
    if (encoding === 'ascii') b = c < 0x7f && c >= 0x20 ? c : 0x3f;
    else b = c < 256 && CODE_TO_EBCDIC[c] >= 0 ? CODE_TO_EBCDIC[c] : CODE_TO_EBCDIC[0x3f];
    out[offset + i] = b;
  }
  return out;
}

/** Split a 3200-byte header into its 40 cards of 80 characters. */
export function textCards(bytes: Uint8Array, encoding: TextEncoding): string[] {
  const text = decodeText(bytes, encoding);
  const cards: string[] = [];
  for (let i = 0; i < CARDS_PER_HEADER; i++) cards.push(text.slice(i * CARD_CHARS, (i + 1) * CARD_CHARS));
  return cards;
}

/**
 * A card is free when nothing but its "Cnn" label (or nothing at all) is on it: such cards may take
 * Dipweave's processing note without overwriting anyone's text.
 */
export function isFreeCard(card: string): boolean {
  return /^\s*(C\s?\d{0,2})?\s*$/.test(card);
}
