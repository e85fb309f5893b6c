/** The reproducibility appendix: software version, inputs with their SHA-256, the spec, seeds and the date. */
import type { ModelSpec } from '../model/spec';
import { andList } from './methods';
import type { CodeBlock, Section } from './model';

export interface Provenance {
  readonly software: { readonly name: string; readonly version: string };
  /** Input files by name (no folder), with the SHA-256 of their bytes in hex. */
  readonly inputs: readonly { readonly name: string; readonly sha256: string; readonly rows?: number }[];
  /** The project file the report was made from, by name (no folder), with the SHA-256 of its bytes in hex. */
  readonly project?: { readonly name: string; readonly sha256: string };
  readonly seeds: readonly { readonly what: string; readonly value: number }[];
  /** ISO 8601 date-time the report was made. */
  readonly createdAt: string;
  /** The command or action that made the report, for rerunning it. */
  readonly command?: string;
  readonly settings?: readonly string[];
}

/** One JSON block per distinct spec, titled with the groups that use it (one untitled block when all share it). */
function specBlocks(spec: ModelSpec, groupSpecs: readonly { group: string; spec: ModelSpec }[]): CodeBlock[] {
  const byText = new Map<string, string[]>();
  for (const g of groupSpecs) {
    const text = JSON.stringify(g.spec, null, 2);
    byText.set(text, [...(byText.get(text) ?? []), g.group]);
  }
  if (byText.size <= 1) return [{ kind: 'code', title: 'Model spec (JSON)', text: [...byText.keys()][0] ?? JSON.stringify(spec, null, 2) }];
  return [...byText].map(([text, groups]) => ({ kind: 'code', title: `Model spec of ${andList(groups)} (JSON)`, text }));
}

export function appendixSection(p: Provenance, spec: ModelSpec, groupSpecs: readonly { group: string; spec: ModelSpec }[] = []): Section {
  const items = [
    `Software: ${p.software.name} ${p.software.version}.`,
    `Made: ${p.createdAt}.`,
    ...(p.project ? [`Project file: ${p.project.name}, SHA-256 ${p.project.sha256}.`] : []),
    ...p.inputs.map((i) => `Input: ${i.name}${i.rows !== undefined ? ` (${i.rows} rows)` : ''}, SHA-256 ${i.sha256}.`),
    ...(p.seeds.length ? p.seeds.map((s) => `Seed of ${s.what}: ${s.value}.`) : ['No random numbers were drawn.']),
    ...(p.settings ?? []),
    ...(p.command ? [`Command: ${p.command}`] : []),
  ];
  return {
    id: 'appendix',
    heading: 'Appendix: how to reproduce this report',
    blocks: [
      { kind: 'list', items },
      ...specBlocks(spec, groupSpecs),
    ],
  };
}
