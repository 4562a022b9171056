/** What a command produced: text for standard output and for standard error. */
export interface CommandOutput {
  readonly stdout: string;
  readonly stderr: string;
  /** Exit status to report when the command ran but its verdict is negative (e.g. a failed check); absent means 0. */
  readonly status?: number;
}
