import { z } from 'zod';
import type { Migration } from '../migrations';

/**
 * Version 2 kept no record of the reports made from the project.
 *
 * To version 3: `reportHistory` is added, empty (a version-2 file says
 * nothing of its reports, so the next report has no earlier one to compare
 * with). Every other member is carried over unchanged.
 */
const v2Schema = z.object({ formatVersion: z.literal(2) }).passthrough();

export const v2ToV3: Migration = {
  from: 2,
  to: 3,
  summary: 'a history of the reports made (empty for older files)',
  upgrade: (input) => ({ ...v2Schema.parse(input), formatVersion: 3, reportHistory: [] }),
};
