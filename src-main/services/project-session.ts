import { mkdir } from 'node:fs/promises';
import { dirname, join } from 'node:path';
import type { ProjectDocument } from '@shared/project/document';
import type { ImportedSource } from '@shared/project/imported-source';
import type { SheetGrid } from '@shared/project/sheet-grid';
import type { LoadedSource, OpenedProject, RecoveryOffer, WireDocument } from '@shared/host/contract';
import { PROGRAMME_NAME } from '@shared/demo/programme';
import { demoProjectWithImports } from '../demo/demo-project';
import { loadProject, saveProject } from '../project/project-store';
import { checkRecovery, createAutosaver, discardRecovery, type Autosaver } from '../project/autosave';
import { projectDisplayName, recoveryPathFor, untitledRecoveryPath, PROJECT_EXTENSION } from '../project/project-paths';
import { rebuildSource, type ImportedSourceData, type SourceMapping } from './record-import';
import { mappingsMember, storedMappings } from '../project/stored-mappings';

/**
 * The project as the main process holds it between calls: the cells and the
 * column mapping of every source imported or opened (the page only keeps the
 * sources' identities), so that saving writes a complete project file.
 */
export class ProjectSessionError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ProjectSessionError';
  }
}

interface KeptSource {
  stored: ImportedSource;
  mapping: SourceMapping;
}

function toWire(doc: ProjectDocument): WireDocument {
  return { ...doc, sources: doc.sources.map(({ sheets: _s, ...ref }) => (void _s, ref)) };
}

export class ProjectSession {
  private readonly kept = new Map<string, KeptSource>();
  private readonly autosavers = new Map<string, Autosaver>();

  constructor(private readonly userDataDir: string, private readonly autosaveDelayMs = 3000) {}

  /** Remembers an import's cells and mapping; the page adds the source to its document. */
  keep(data: ImportedSourceData): void {
    this.kept.set(data.stored.id, { stored: data.stored, mapping: data.mapping });
  }

  private fullDocument(doc: WireDocument): ProjectDocument {
    const sources = doc.sources.map((ref) => {
      const k = this.kept.get(ref.id);
      if (!k) throw new ProjectSessionError(`The cells of "${ref.fileName}" are no longer held by Tallywise, so the project cannot be written completely. Import the workbook again, then save.`);
      return k.stored;
    });
    return { ...doc, sources, mapping: mappingsMember(doc.sources.map((ref) => this.kept.get(ref.id)!.mapping)) };
  }

  private opened(doc: ProjectDocument, path: string | null, migrationSteps: string[] = []): OpenedProject {
    const mappings = storedMappings(doc.mapping);
    const sources: LoadedSource[] = doc.sources.map((s) => {
      const mapping = mappings.get(s.id);
      const loaded = rebuildSource(s, mapping);
      this.kept.set(s.id, { stored: s, mapping: mapping! });
      return loaded;
    });
    return { document: toWire(doc), path, name: path ? projectDisplayName(path) : doc.programme.name, sources, migrationSteps };
  }

  /** The demo programme's workbooks imported afresh; with `recorded`, its recorded cleaning and chosen models too. */
  async newFromDemo(recorded = false): Promise<OpenedProject> {
    const { document, imports } = await demoProjectWithImports({ dir: join(this.userDataDir, 'demo-workbooks'), recorded });
    for (const data of imports) this.keep(data);
    return { document: toWire(document), path: null, name: PROGRAMME_NAME, sources: imports.map((i) => i.loaded), migrationSteps: [] };
  }

  /** The stored cells of a sheet of a source the session holds (the linked site list), or null. */
  sheetCells(sourceId: string, sheet: string): SheetGrid | null {
    return this.kept.get(sourceId)?.stored.sheets.find((g) => g.name === sheet) ?? null;
  }

  /** The sheets kept of a source the session holds, marked where the records come from; none for an unknown source. */
  sourceSheets(sourceId: string): { name: string; rows: number; columns: number; records: boolean }[] {
    const k = this.kept.get(sourceId);
    if (!k) return [];
    const recordSheets = k.mapping.recordSheets;
    return k.stored.sheets.map((g) => ({ name: g.name, rows: g.rows, columns: g.columns, records: recordSheets ? recordSheets.includes(g.name) : true }));
  }

  private untitledRecovery(): string {
    return untitledRecoveryPath(this.userDataDir);
  }

  /** Opens a project file, or (fromRecovery) the unsaved work kept beside it. */
  async open(path: string, fromRecovery = false): Promise<OpenedProject> {
    if (!fromRecovery) {
      const loaded = await loadProject(path);
      return this.opened(loaded.document, path, loaded.migrationSteps);
    }
    const untitled = path === this.untitledRecovery();
    const recovery = untitled || path.endsWith('.recovery') ? path : recoveryPathFor(path);
    const loaded = await loadProject(recovery);
    const projectPath = untitled ? null : recovery.slice(0, -'.recovery'.length);
    return this.opened(loaded.document, projectPath, loaded.migrationSteps);
  }

  async save(path: string, doc: WireDocument): Promise<{ path: string; name: string; savedAt: string }> {
    const target = /\.[A-Za-z0-9]+$/.test(path) ? path : `${path}${PROJECT_EXTENSION}`;
    const now = new Date().toISOString();
    await saveProject(target, this.fullDocument({ ...doc, modifiedAt: now }));
    for (const recovery of [recoveryPathFor(target), this.untitledRecovery()]) {
      this.autosavers.get(recovery)?.dispose();
      this.autosavers.delete(recovery);
      await discardRecovery(recovery);
    }
    return { path: target, name: projectDisplayName(target), savedAt: now };
  }

  private recoveryPath(path: string | null): string {
    return path ? recoveryPathFor(path) : this.untitledRecovery();
  }

  async autosave(path: string | null, doc: WireDocument): Promise<void> {
    const recoveryPath = this.recoveryPath(path);
    let saver = this.autosavers.get(recoveryPath);
    if (!saver) {
      await mkdir(dirname(recoveryPath), { recursive: true });
      saver = createAutosaver({ recoveryPath, delayMs: this.autosaveDelayMs * 3, quietMs: this.autosaveDelayMs });
      this.autosavers.set(recoveryPath, saver);
    }
    saver.changed(this.fullDocument(doc));
  }

  async checkRecovery(path: string | null): Promise<RecoveryOffer | null> {
    const recoveryPath = this.recoveryPath(path);
    // An untitled project has no file of its own: any recovery file is newer.
    const projectPath = path ?? join(dirname(recoveryPath), `no-such-project${PROJECT_EXTENSION}`);
    const offer = await checkRecovery(projectPath, recoveryPath);
    if (!offer) return null;
    const log = offer.document?.cleaning;
    return {
      recoveryPath,
      projectPath: path,
      savedAt: offer.savedAt.toISOString(),
      programme: offer.document?.programme.name ?? null,
      edits: log ? log.cursor : 0,
      problem: offer.problem,
    };
  }

  async discardRecovery(path: string | null): Promise<void> {
    const recoveryPath = this.recoveryPath(path);
    this.autosavers.get(recoveryPath)?.dispose();
    this.autosavers.delete(recoveryPath);
    await discardRecovery(recoveryPath);
  }

  /** Writes waiting autosaves now (before quitting). */
  async flush(): Promise<void> {
    await Promise.all([...this.autosavers.values()].map((s) => s.flush()));
  }
}
