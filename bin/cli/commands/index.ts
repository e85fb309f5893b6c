import type { CliCommand } from '../command';
import { demo } from './demo';

/** Every command, in the order `tallywise help` lists them. */
export const commands: readonly CliCommand[] = [demo];
