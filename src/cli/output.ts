/** What a command produced: text for standard output and for standard error. */
export interface CommandOutput {
  readonly stdout: string;
  readonly stderr: string;
}
