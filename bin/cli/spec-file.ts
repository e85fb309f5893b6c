import { readFile } from 'node:fs/promises';
import { basename } from 'node:path';
import { parseModelSpec, type ModelSpec } from '@shared/model/spec';
import { UsageError } from './command';

/** Reads and checks a model spec JSON file; every fault names the file. */
export async function readSpecFile(path: string): Promise<ModelSpec> {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch {
    throw new UsageError(`Cannot read the spec file ${path}. Check the path.`);
  }
  let json: unknown;
  try {
    json = JSON.parse(text.replace(/^\uFEFF/, ''));
  } catch (err) {
    throw new UsageError(`The spec file ${basename(path)} is not valid JSON (${(err as Error).message}). Fix the file and run again.`);
  }
  try {
    return parseModelSpec(json, `The spec file ${basename(path)}`);
  } catch (err) {
    throw new UsageError((err as Error).message);
  }
}
