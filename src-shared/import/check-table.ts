import { datePatternFindings } from './date-checks';
import type { Finding } from './findings';
import type { ImportedTable } from './imported-table';
import { linkFindings, type FindingLinks, type LinkedFinding } from './linked-findings';
import type { MappingResult } from './mapping';
import type { MappingTemplate } from './mapping-template';
import { formulaErrors, runChecks } from './validate';

/**
 * Every check on one mapped table, as `tallywise check` runs them: the
 * mapping's own findings (template, effort unit), formula errors, the record
 * checks and, without a season window, the date-pattern checks. Each finding
 * comes with the records it concerns.
 */
export function checkMappedTable(table: ImportedTable, template: MappingTemplate, mapped: MappingResult, file: string): LinkedFinding[] {
  const { records } = mapped;
  const placed: Finding[] = [...mapped.findings, ...formulaErrors(table)];
  if (!template.seasonWindow) placed.push(...datePatternFindings(records, file));
  const links = new Map<Finding, Partial<FindingLinks>>();
  const checked = runChecks(records, {
    file, effortUnit: mapped.effortUnit, hasArea: mapped.hasArea, hasDate: mapped.hasDate,
    seasonWindow: template.seasonWindow, dateOrderPending: mapped.questions.length > 0 || table.findings.some((f) => f.code === 'mixed-date-order'),
  }, links);
  return linkFindings([...placed, ...checked], records, links);
}
