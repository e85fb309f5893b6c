import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { createHash } from 'node:crypto';
import { gzipSync } from 'node:zlib';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { loadProject, saveProject } from '../../src-main/project/project-store';
import { ProjectFileError } from '../../src-main/project/project-file-error';
import { encodeContainer, readHeader } from '../../src-main/project/file-format';
import { backupPathFor } from '../../src-main/project/project-paths';
import { CURRENT_FORMAT_VERSION } from '@shared/project/schema';
import { sampleProject } from './sample-project';
import { snapshot, tempFolder } from './temp-folder';

let folder: ReturnType<typeof tempFolder>;
let file: string;
beforeEach(() => {
  folder = tempFolder();
  file = join(folder.dir, 'wetland.tallywise');
});
afterEach(() => folder.remove());

async function rejection(path: string): Promise<ProjectFileError> {
  try {
    await loadProject(path);
  } catch (err) {
    if (err instanceof ProjectFileError) return err;
    throw err;
  }
  throw new Error('the file was accepted');
}

/** Loads and expects a refusal with `code`, and that no file in the folder changed. */
async function expectRefused(path: string, code: ProjectFileError['code'], message: RegExp): Promise<void> {
  const before = snapshot(folder.dir);
  const err = await rejection(path);
  expect(err.code).toBe(code);
  expect(err.message).toMatch(message);
  expect(err.file).toBe(path);
  expect(snapshot(folder.dir)).toEqual(before);
}

describe('saveProject / loadProject', () => {
  it('a saved project loads back equal, every part included', async () => {
    const doc = sampleProject();
    await saveProject(file, doc);
    const loaded = await loadProject(file);
    expect(loaded.document).toEqual(doc);
    expect(loaded.fileFormatVersion).toBe(CURRENT_FORMAT_VERSION);
    expect(loaded.migrationSteps).toEqual([]);
  });

  it('keeps the replaced file as .bak and leaves no temporary file', async () => {
    await saveProject(file, sampleProject({ name: 'First' }));
    expect(Object.keys(snapshot(folder.dir))).toEqual(['wetland.tallywise']);
    await saveProject(file, sampleProject({ name: 'Second' }));
    await saveProject(file, sampleProject({ name: 'Third' }));
    expect(Object.keys(snapshot(folder.dir))).toEqual(['wetland.tallywise', 'wetland.tallywise.bak']);
    expect((await loadProject(file)).document.programme.name).toBe('Third');
    expect((await loadProject(backupPathFor(file))).document.programme.name).toBe('Second');
  });

  it('does not let a damaged file replace a good backup', async () => {
    await saveProject(file, sampleProject({ name: 'First' }));
    await saveProject(file, sampleProject({ name: 'Second' }));
    writeFileSync(file, readFileSync(file).subarray(0, 300)); // cut off, e.g. by a failed copy
    await saveProject(file, sampleProject({ name: 'Third' }));
    expect((await loadProject(file)).document.programme.name).toBe('Third');
    expect((await loadProject(backupPathFor(file))).document.programme.name).toBe('First');
    // a foreign file being replaced is kept as the backup
    writeFileSync(file, 'notes, not a project');
    await saveProject(file, sampleProject({ name: 'Fourth' }));
    expect(readFileSync(backupPathFor(file), 'utf8')).toBe('notes, not a project');
  });

  it('refuses to save a document that breaks the schema, writing nothing', async () => {
    const bad = { ...sampleProject(), models: [{ id: 'm1', name: '', chosen: true, spec: { response: 'count', distribution: 'poisson' } }] };
    await expect(saveProject(file, bad as never)).rejects.toThrow(/models\.0\.name/);
    expect(snapshot(folder.dir)).toEqual({});
  });

  it('names the file and the reason when the folder does not exist', async () => {
    const err = await saveProject(join(folder.dir, 'no-such-folder', 'x.tallywise'), sampleProject()).catch((e) => e);
    expect(err).toBeInstanceOf(ProjectFileError);
    expect(err.code).toBe('unwritable');
    expect(err.message).toMatch(/"x\.tallywise" could not be saved: the folder does not exist/);
  });
});

describe('loadProject refuses bad files and changes nothing on disk', () => {
  beforeEach(async () => {
    await saveProject(file, sampleProject({ name: 'Good one' }));
    await saveProject(file, sampleProject({ name: 'Good two' }));
  });
  const good = () => readFileSync(file);

  it('a flipped byte in the body: damaged (checksum)', async () => {
    const bytes = good();
    bytes[bytes.length - 40] ^= 0x01;
    writeFileSync(file, bytes);
    await expectRefused(file, 'damaged', /"wetland\.tallywise" is damaged: its content does not match the checksum.*backup "wetland\.tallywise\.bak"/);
  });

  it('a file cut off in the body, in the header, or empty: damaged', async () => {
    const bytes = good();
    writeFileSync(file, bytes.subarray(0, bytes.length - 1000));
    await expectRefused(file, 'damaged', /cut off: \d+ of \d+ body bytes/);
    writeFileSync(file, bytes.subarray(0, 40));
    await expectRefused(file, 'damaged', /header has no end/);
    writeFileSync(file, bytes.subarray(0, 10));
    await expectRefused(file, 'damaged', /ends inside its first line/);
    writeFileSync(file, '');
    await expectRefused(file, 'damaged', /is empty/);
  });

  it('line ends changed by a copy in text mode: damaged, saying so', async () => {
    const bytes = good();
    const split = bytes.indexOf('\n\n');
    const header = bytes.subarray(0, split + 2).toString('latin1').replace(/\n/g, '\r\n');
    writeFileSync(file, Buffer.concat([Buffer.from(header, 'latin1'), bytes.subarray(split + 2)]));
    await expectRefused(file, 'damaged', /line ends were changed/);
  });

  it('header lines it does not know are ignored (room for later additions)', async () => {
    const bytes = good();
    const at = bytes.indexOf('\n') + 1;
    writeFileSync(file, Buffer.concat([bytes.subarray(0, at), Buffer.from('written-by: a later tool\n'), bytes.subarray(at)]));
    expect((await loadProject(file)).document.programme.name).toBe('Good two');
  });

  it('a body that is not gzip, or not JSON, under a correct checksum: damaged', async () => {
    const withHeader = (body: Buffer) =>
      Buffer.concat([
        Buffer.from(`TALLYWISE PROJECT FILE\nformat-version: 1\nbody-encoding: gzip-json-utf8\nbody-length: ${body.length}\nbody-sha256: ${createHash('sha256').update(body).digest('hex')}\n\n`),
        body,
      ]);
    writeFileSync(file, withHeader(Buffer.from('this is not compressed')));
    await expectRefused(file, 'damaged', /not valid gzip/);
    writeFileSync(file, withHeader(gzipSync('{"formatVersion": 1, "programme": ')));
    await expectRefused(file, 'damaged', /not valid JSON/);
  });

  it('valid container, content that breaks the schema: damaged, naming the place', async () => {
    const body = { ...sampleProject(), models: 'none' };
    writeFileSync(file, encodeContainer(body, CURRENT_FORMAT_VERSION));
    await expectRefused(file, 'damaged', /models: /);
    writeFileSync(file, encodeContainer({ ...sampleProject(), formatVersion: 0 }, 1));
    await expectRefused(file, 'damaged', /header says format 1 but its content says 0/);
  });

  it('a workbook, a JSON file or a text file: foreign', async () => {
    writeFileSync(file, Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x14, 0, 0, 0]));
    await expectRefused(file, 'foreign', /"wetland\.tallywise" is not a Tallywise project file/);
    writeFileSync(file, JSON.stringify(sampleProject()));
    await expectRefused(file, 'foreign', /not a Tallywise project file/);
    writeFileSync(file, 'TALLYWISE PROJECT NOTES\n\nhello');
    await expectRefused(file, 'foreign', /not a Tallywise project file/);
  });

  it('a file from a newer version: newer-version, before its body is even checked', async () => {
    const bytes = Buffer.from(encodeContainer({ formatVersion: 99 }, 99));
    bytes[bytes.length - 5] ^= 0xff;
    writeFileSync(file, bytes);
    await expectRefused(file, 'newer-version', /saved by a newer Tallywise \(project format 99; this version reads up to 3\)\. Update Tallywise/);
  });

  it('a missing file or a folder: unreadable', async () => {
    await expectRefused(join(folder.dir, 'gone.tallywise'), 'unreadable', /"gone\.tallywise" cannot be opened: there is no such file/);
    mkdirSync(join(folder.dir, 'folder.tallywise'));
    await expectRefused(join(folder.dir, 'folder.tallywise'), 'unreadable', /it is a folder/);
  });
});

describe('older files', () => {
  const v0 = JSON.parse(readFileSync(join(__dirname, 'fixtures/project-v0.json'), 'utf8'));

  it('are converted in memory; saving writes the current version and keeps the old file as .bak', async () => {
    const oldBytes = encodeContainer(v0, 0);
    writeFileSync(file, oldBytes);
    const loaded = await loadProject(file);
    expect(loaded.fileFormatVersion).toBe(0);
    expect(loaded.migrationSteps).toHaveLength(CURRENT_FORMAT_VERSION);
    expect(loaded.document.programme.name).toBe('Hillside pasture transects');
    expect(Buffer.compare(readFileSync(file), Buffer.from(oldBytes))).toBe(0);
    expect(Object.keys(snapshot(folder.dir))).toEqual(['wetland.tallywise']);

    await saveProject(file, loaded.document);
    expect(readHeader(readFileSync(file)).header.formatVersion).toBe(CURRENT_FORMAT_VERSION);
    expect(Buffer.compare(readFileSync(backupPathFor(file)), Buffer.from(oldBytes))).toBe(0);
    expect((await loadProject(file)).document).toEqual(loaded.document);
  });
});
