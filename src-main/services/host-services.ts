import type { HostServices } from '@shared/host/contract';
import type { HostEnvironment } from './ports';
import { demoOverview } from './demo-overview';
import { listSheets } from '../import/import-file';
import { readWorkbook } from './record-import';
import type { ImportProgress } from './import-progress';
import { RunningJobs } from './running-jobs';
import { ProjectSession } from './project-session';
import { writeReportFiles } from '../report/write-report';
import { fileFingerprint } from '../report/project-report';
import { writeCleanedExport } from '../export/write-export';

/** All host calls, as plain async functions over the environment's ports. */
export function createHostServices(env: HostEnvironment): HostServices {
  const session = new ProjectSession(env.userDataDir);
  const jobs = new RunningJobs();
  return {
    'app:info': async () => ({ name: env.appName, version: env.appVersion, platform: env.platform }),
    'demo:overview': async () => demoOverview(),
    'dialog:choose-open': async ({ title, extensions }) => ({ path: await env.dialogs.chooseOpen(title, extensions) }),
    'dialog:choose-save': async ({ title, defaultName, extensions }) => ({
      path: await env.dialogs.chooseSave(title, defaultName, extensions),
    }),
    'dialog:choose-folder': async ({ title }) => ({ path: env.dialogs.chooseFolder ? await env.dialogs.chooseFolder(title) : null }),
    'file:reveal': async ({ path }) => ({ ok: await env.shell.reveal(path) }),
    'file:open': async ({ path }) => ({ ok: env.shell.open ? await env.shell.open(path) : await env.shell.reveal(path) }),
    'file:fingerprint': async ({ path }) => fileFingerprint(path),
    'import:list-sheets': async ({ path }) => ({ sheets: await listSheets(path) }),
    'import:read-workbook': async ({ path, sheet, dateOrder, roles, jobId }) => {
      const onProgress = jobId && env.progress ? (p: ImportProgress) => env.progress!({ jobId, ...p }) : undefined;
      const reading = await jobs.run(jobId, (signal) => readWorkbook(path, { sheet, dateOrder, roles, onProgress, signal }));
      if (reading.data) session.keep(reading.data);
      return { source: reading.data?.loaded ?? null, questions: reading.questions.map(({ options: _o, examples, ...q }) => (void _o, { ...q, examples: [...examples] })), headers: reading.headers, rolesNeeded: reading.rolesNeeded };
    },
    'import:cancel': async ({ jobId }) => ({ cancelled: jobs.cancel(jobId) }),
    'project:new-from-demo': async ({ recorded }) => session.newFromDemo(recorded),
    'project:open': async ({ path, fromRecovery }) => session.open(path, fromRecovery),
    'project:save': async ({ path, document }) => session.save(path, document),
    'project:autosave': async ({ path, document }) => {
      await session.autosave(path, document);
      return { ok: true };
    },
    'project:check-recovery': async ({ path }) => ({ offer: await session.checkRecovery(path) }),
    'project:discard-recovery': async ({ path }) => {
      await session.discardRecovery(path);
      return { ok: true };
    },
    'project:sheet-cells': async ({ sourceId, sheet }) => ({ grid: session.sheetCells(sourceId, sheet) }),
    'project:source-sheets': async ({ sourceId }) => ({ sheets: session.sourceSheets(sourceId) }),
    'report:write': async ({ document, folder, stem }) => ({ ...(await writeReportFiles(document, folder, stem)) }),
    'export:write': async ({ document, path, table }) => {
      const w = await writeCleanedExport(document, path, table);
      return { ...w, sheets: [...w.sheets] };
    },
  };
}
