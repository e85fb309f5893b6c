/**
 * Which encoding a text file is in: a byte-order mark settles UTF-8,
 * UTF-16 LE and UTF-16 BE; without one, many zero bytes at odd or even
 * places mean UTF-16 without a mark; bytes that are valid UTF-8 are UTF-8;
 * anything else is read as Windows-1252 (the usual encoding of CSV files
 * saved by Western-European spreadsheet programs — common practice).
 */
export type EncodingName = 'utf-8' | 'utf-8 with BOM' | 'utf-16le' | 'utf-16be' | 'windows-1252';

export interface DecodedText {
  readonly text: string;
  readonly encoding: EncodingName;
}

function zeroShare(bytes: Uint8Array, parity: 0 | 1): number {
  const n = Math.min(bytes.length, 4096);
  let zeros = 0;
  for (let i = parity; i < n; i += 2) if (bytes[i] === 0) zeros++;
  return zeros / Math.max(1, Math.floor(n / 2));
}

export function decodeText(bytes: Uint8Array, given?: EncodingName): DecodedText {
  const decode = (label: string, from = 0) => new TextDecoder(label).decode(bytes.subarray(from));
  if (given) {
    const label = given === 'utf-8 with BOM' ? 'utf-8' : given;
    return { text: decode(label).replace(/^\uFEFF/, ''), encoding: given };
  }
  if (bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf) return { text: decode('utf-8', 3), encoding: 'utf-8 with BOM' };
  if (bytes[0] === 0xff && bytes[1] === 0xfe) return { text: decode('utf-16le', 2), encoding: 'utf-16le' };
  if (bytes[0] === 0xfe && bytes[1] === 0xff) return { text: decode('utf-16be', 2), encoding: 'utf-16be' };
  if (bytes.length >= 4) {
    if (zeroShare(bytes, 1) > 0.3 && zeroShare(bytes, 0) < 0.05) return { text: decode('utf-16le'), encoding: 'utf-16le' };
    if (zeroShare(bytes, 0) > 0.3 && zeroShare(bytes, 1) < 0.05) return { text: decode('utf-16be'), encoding: 'utf-16be' };
  }
  try {
    return { text: new TextDecoder('utf-8', { fatal: true }).decode(bytes), encoding: 'utf-8' };
  } catch {
    return { text: decode('windows-1252'), encoding: 'windows-1252' };
  }
}

/** Whether the bytes look like text at all (few control characters), to tell a renamed binary file from a CSV. */
export function looksLikeText(text: string): boolean {
  const n = Math.min(text.length, 8192);
  if (n === 0) return true;
  let bad = 0;
  for (let i = 0; i < n; i++) {
    const c = text.charCodeAt(i);
    if ((c < 32 && c !== 9 && c !== 10 && c !== 13) || c === 0xfffd) bad++;
  }
  return bad / n < 0.02;
}
