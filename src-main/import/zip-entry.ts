import { inflateRawSync } from 'node:zlib';

/**
 * Finds one entry of a zip file through its central directory and inflates
 * it with Node's native zlib. Used for worksheet parts, which are the bulk
 * of a workbook (60 MB of XML for 200k rows): native inflate is several
 * times faster than a JavaScript one. Returns null when the entry is absent;
 * throws a plain Error when the zip structure is damaged.
 */
function findEndOfCentralDirectory(b: Uint8Array): number {
  const min = Math.max(0, b.length - 22 - 65_535);
  for (let i = b.length - 22; i >= min; i--) {
    if (b[i] === 0x50 && b[i + 1] === 0x4b && b[i + 2] === 0x05 && b[i + 3] === 0x06) return i;
  }
  throw new Error('the end of the zip directory is missing');
}

export function inflateEntry(bytes: Uint8Array, name: string): Uint8Array | null {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const eocd = findEndOfCentralDirectory(bytes);
  const entries = view.getUint16(eocd + 10, true);
  let p = view.getUint32(eocd + 16, true);
  const decoder = new TextDecoder();
  for (let e = 0; e < entries; e++) {
    if (p + 46 > bytes.length || view.getUint32(p, true) !== 0x02014b50) throw new Error('the zip directory is damaged');
    const method = view.getUint16(p + 10, true);
    const compressed = view.getUint32(p + 20, true);
    const size = view.getUint32(p + 24, true);
    const nameLen = view.getUint16(p + 28, true);
    const extraLen = view.getUint16(p + 30, true);
    const commentLen = view.getUint16(p + 32, true);
    const local = view.getUint32(p + 42, true);
    const entryName = decoder.decode(bytes.subarray(p + 46, p + 46 + nameLen)).replace(/^\//, '');
    p += 46 + nameLen + extraLen + commentLen;
    if (entryName !== name) continue;
    if (local + 30 > bytes.length || view.getUint32(local, true) !== 0x04034b50) throw new Error(`the zip entry ${name} is damaged`);
    const start = local + 30 + view.getUint16(local + 26, true) + view.getUint16(local + 28, true);
    if (start + compressed > bytes.length) throw new Error(`the zip entry ${name} is cut short`);
    const data = bytes.subarray(start, start + compressed);
    if (method === 0) return data;
    if (method !== 8) throw new Error(`the zip entry ${name} uses an unsupported compression method (${method})`);
    // One output chunk of the known size: no copying of many small chunks together.
    const out = inflateRawSync(data, { chunkSize: Math.max(64 * 1024, size + 1024) });
    if (out.length !== size) throw new Error(`the zip entry ${name} unpacks to the wrong size`);
    return out;
  }
  return null;
}
