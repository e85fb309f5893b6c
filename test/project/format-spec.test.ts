import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gunzipSync } from 'node:zlib';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { saveProject } from '../../src-main/project/project-store';
import { sampleProject } from './sample-project';
import { tempFolder } from './temp-folder';

// A reader written only from docs/project-format.md, with Node's own zlib
// and crypto instead of the project's code: a saved file must be readable
// by another program that follows the document.
function readByTheDocument(bytes: Buffer): { header: Record<string, string>; body: unknown } {
  const split = bytes.indexOf('\n\n');
  const lines = bytes.subarray(0, split).toString('ascii').split('\n');
  expect(lines[0]).toBe('TALLYWISE PROJECT FILE');
  const header = Object.fromEntries(lines.slice(1).map((l) => l.split(': ', 2) as [string, string]));
  const body = bytes.subarray(split + 2);
  expect(body.length).toBe(Number(header['body-length']));
  expect(createHash('sha256').update(body).digest('hex')).toBe(header['body-sha256']);
  return { header, body: JSON.parse(gunzipSync(body).toString('utf8')) };
}

let folder: ReturnType<typeof tempFolder>;
beforeEach(() => (folder = tempFolder()));
afterEach(() => folder.remove());

describe('docs/project-format.md describes the file as written', () => {
  it('header fields, gzip body, checksum and JSON content are as documented', async () => {
    const file = join(folder.dir, 'p.tallywise');
    const doc = sampleProject();
    await saveProject(file, doc);
    const { header, body } = readByTheDocument(readFileSync(file));
    expect(header['format-version']).toBe('3');
    expect(header['body-encoding']).toBe('gzip-json-utf8');
    expect(body).toEqual(doc);
    // gzip magic bytes 1f 8b (RFC 1952)
    const bytes = readFileSync(file);
    expect([...bytes.subarray(bytes.indexOf('\n\n') + 2, bytes.indexOf('\n\n') + 4)]).toEqual([0x1f, 0x8b]);
  });

  it('the document lists every header field and top-level member the file has', async () => {
    const text = readFileSync(join(__dirname, '../../docs/project-format.md'), 'utf8');
    for (const field of ['format-version', 'body-encoding', 'body-length', 'body-sha256']) expect(text).toContain(`\`${field}\``);
    for (const key of Object.keys(sampleProject())) expect(text, `docs/project-format.md should describe "${key}"`).toContain(`\`${key}\``);
  });
});
