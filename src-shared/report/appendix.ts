/** The reproducibility appendix: software version, inputs with their SHA-256, the spec, seeds and the date. */
import type { ModelSpec } from '../model/spec';
import type { Section } from './model';

export interface Provenance {
  readonly software: { readonly name: string; readonly version: string };
  /** Input files by name (no folder), with the SHA-256 of their bytes in hex. */
  readonly inputs: readonly { readonly name: string; readonly sha256: string; readonly rows?: number }[];
  readonly seeds: readonly { readonly what: string; readonly value: number }[];
  /** ISO 8601 date-time the report was made. */
  readonly createdAt: string;
  /** The command or action that made the report, for rerunning it. */
  readonly command?: string;
  readonly settings?: readonly string[];
}

export function appendixSection(p: Provenance, spec: ModelSpec): Section {
  const items = [
    `Software: ${p.software.name} ${p.software.version}.`,
    `Made: ${p.createdAt}.`,
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
      { kind: 'code', title: 'Model spec (JSON)', text: JSON.stringify(spec, null, 2) },
    ],
  };
}
