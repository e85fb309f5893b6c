import { createHash } from 'node:crypto';
import { gunzipSync, gzipSync } from 'fflate';

/**
 * The container of a `.tallywise` file (docs/project-format.md): a short
 * plain-text header, then the body, a gzip-compressed UTF-8 JSON document.
 *
 *     TALLYWISE PROJECT FILE
 *     format-version: 1
 *     body-encoding: gzip-json-utf8
 *     body-length: 18342
 *     body-sha256: 3f1c...e9
 *     <empty line>
 *     <body bytes>
 *
 * This module only packs and unpacks; what the JSON must hold is the
 * project schema's business.
 */
export const MAGIC_LINE = 'TALLYWISE PROJECT FILE';
export const BODY_ENCODING = 'gzip-json-utf8';
const MAX_HEADER_BYTES = 4096;

export interface ContainerHeader {
  formatVersion: number;
  bodyEncoding: string;
  bodyLength: number;
  bodySha256: string;
}

/** Why unpacking failed; the caller turns it into a message naming the file. */
export type ContainerFault =
  | { kind: 'foreign' }
  | { kind: 'newer-version'; version: number }
  | { kind: 'damaged'; detail: string };

export class ContainerError extends Error {
  constructor(readonly fault: ContainerFault) {
    super(fault.kind === 'damaged' ? fault.detail : fault.kind);
    this.name = 'ContainerError';
  }
}

const damaged = (detail: string) => new ContainerError({ kind: 'damaged', detail });

export function sha256Hex(bytes: Uint8Array): string {
  return createHash('sha256').update(bytes).digest('hex');
}

/** Packs a JSON-serialisable body under a header of the given format version. */
export function encodeContainer(body: unknown, formatVersion: number): Uint8Array {
  const json = new TextEncoder().encode(JSON.stringify(body));
  const gz = gzipSync(json, { level: 6, mtime: 0 });
  const header =
    `${MAGIC_LINE}\n` +
    `format-version: ${formatVersion}\n` +
    `body-encoding: ${BODY_ENCODING}\n` +
    `body-length: ${gz.length}\n` +
    `body-sha256: ${sha256Hex(gz)}\n\n`;
  const head = new TextEncoder().encode(header);
  const out = new Uint8Array(head.length + gz.length);
  out.set(head, 0);
  out.set(gz, head.length);
  return out;
}

const magicBytes = new TextEncoder().encode(`${MAGIC_LINE}\n`);

function startsWithMagic(bytes: Uint8Array): 'yes' | 'cut-off' | 'no' {
  const n = Math.min(bytes.length, magicBytes.length);
  for (let i = 0; i < n; i++) if (bytes[i] !== magicBytes[i]) return 'no';
  return bytes.length >= magicBytes.length ? 'yes' : 'cut-off';
}

function startsWithText(bytes: Uint8Array, text: string): boolean {
  const t = new TextEncoder().encode(text);
  return bytes.length >= t.length && t.every((b, i) => bytes[i] === b);
}

/** Reads the header; returns it and where the body starts. */
export function readHeader(bytes: Uint8Array): { header: ContainerHeader; bodyStart: number } {
  const magic = startsWithMagic(bytes);
  if (magic === 'no' && startsWithText(bytes, `${MAGIC_LINE}\r\n`)) {
    throw damaged('its line ends were changed (it was probably copied or sent as text rather than as a binary file)');
  }
  if (magic === 'no') throw new ContainerError({ kind: 'foreign' });
  if (magic === 'cut-off') throw damaged('the file ends inside its first line');
  let end = -1;
  const limit = Math.min(bytes.length - 1, MAX_HEADER_BYTES);
  for (let i = magicBytes.length - 1; i < limit; i++) {
    if (bytes[i] === 0x0a && bytes[i + 1] === 0x0a) {
      end = i;
      break;
    }
  }
  if (end < 0) throw damaged('the header has no end (the file may be cut off)');
  const fields = new Map<string, string>();
  const lines = new TextDecoder('utf-8').decode(bytes.subarray(magicBytes.length, end)).split('\n');
  for (const line of lines) {
    const m = /^([a-z0-9-]+): (.*)$/.exec(line);
    if (!m) throw damaged(`the header line "${line.slice(0, 60)}" is not "name: value"`);
    fields.set(m[1], m[2]);
  }
  const integer = (name: string): number => {
    const v = fields.get(name);
    if (v === undefined || !/^\d{1,15}$/.test(v)) throw damaged(`the header has no valid ${name}`);
    return Number(v);
  };
  const formatVersion = integer('format-version');
  const bodyEncoding = fields.get('body-encoding') ?? '';
  const bodySha256 = fields.get('body-sha256') ?? '';
  const bodyLength = integer('body-length');
  if (!/^[0-9a-f]{64}$/.test(bodySha256)) throw damaged('the header has no valid body-sha256');
  return { header: { formatVersion, bodyEncoding, bodyLength, bodySha256 }, bodyStart: end + 2 };
}

/**
 * Unpacks a container: checks the header, refuses a version newer than
 * `newestKnown` before looking at the body, then checks length and checksum
 * and decodes the JSON.
 */
export function decodeContainer(bytes: Uint8Array, newestKnown: number): { formatVersion: number; body: unknown } {
  if (bytes.length === 0) throw damaged('the file is empty');
  const { header, bodyStart } = readHeader(bytes);
  if (header.formatVersion > newestKnown) throw new ContainerError({ kind: 'newer-version', version: header.formatVersion });
  if (header.bodyEncoding !== BODY_ENCODING) throw damaged(`the body encoding "${header.bodyEncoding}" is not ${BODY_ENCODING}`);
  const body = bytes.subarray(bodyStart);
  if (body.length < header.bodyLength) throw damaged(`the file is cut off: ${body.length} of ${header.bodyLength} body bytes are there`);
  if (body.length > header.bodyLength) throw damaged(`there are ${body.length - header.bodyLength} bytes more than the header says`);
  if (sha256Hex(body) !== header.bodySha256) throw damaged('its content does not match the checksum in its header');
  let json: string;
  try {
    json = new TextDecoder('utf-8', { fatal: true }).decode(gunzipSync(body));
  } catch {
    throw damaged('the body is not valid gzip-compressed UTF-8 text');
  }
  try {
    return { formatVersion: header.formatVersion, body: JSON.parse(json) };
  } catch {
    throw damaged('the body is not valid JSON');
  }
}
