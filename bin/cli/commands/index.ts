import type { CliCommand } from '../command';
import { check } from './check';
import { demo } from './demo';
import { exportData } from './export';
import { fit } from './fit';
import { merge } from './merge';
import { power } from './power';
import { report } from './report';
import { trend } from './trend';

/** Every command, in the order `tallywise help` lists them. */
export const commands: readonly CliCommand[] = [check, fit, trend, power, report, exportData, merge, demo];
