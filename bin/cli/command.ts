/** What a command prints to. Tests pass a collecting one; the entry point passes stdout/stderr. */
export interface CliIO {
  out(text: string): void;
  err(text: string): void;
}

/**
 * One command of `tallywise`. `run` returns the exit status:
 * 0 success, 1 ran but found problems the user must act on, 2 bad usage or
 * unreadable input (shared/cli-contract.md).
 */
export interface CliCommand {
  readonly name: string;
  /** One line for `tallywise help`. */
  readonly summary: string;
  /** The usage lines shown by `tallywise help NAME` and after a usage error. */
  readonly usage: string;
  run(args: string[], io: CliIO): Promise<number>;
}

/** A fault the user must fix: printed as plain sentences, exit status 2 unless given. */
export class UsageError extends Error {
  constructor(message: string, readonly status = 2) {
    super(message);
    this.name = 'UsageError';
  }
}
