// Child process for atomic-save.test.ts: saves the given encoded project
// versions over one project file, in turn, for ever, until it is killed.
// It runs the very module that does the disk work of saveProject
// (src-main/project/replace-file.mjs, Node built-ins only) with the same
// backup path; the bytes were encoded by the test with the real encoder.
import { readFileSync } from 'node:fs';
import { replaceFile } from '../../src-main/project/replace-file.mjs';

const [target, backupPath, ...versionFiles] = process.argv.slice(2);
const versions = versionFiles.map((p) => readFileSync(p));
process.stdout.write('ready\n');
for (let n = 0; ; n++) {
  await replaceFile(target, versions[n % versions.length], { backupPath });
}
