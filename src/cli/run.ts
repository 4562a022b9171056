/**
 * The command-line front end. It parses, reads files, calls the library and prints; it computes
 * nothing of its own. Errors become one line on standard error and a non-zero exit status.
 */
import { EigenframeError } from '../errors';
import { commandHelp, parseArgs, type CommandSpec, type ParsedArgs } from './args';
import type { CommandOutput } from './output';
import { MODES_SPEC, runModes } from './commands/modes';
import { EXPORT_SPEC, runExport } from './commands/export';
import { REFERENCE_SPEC, runReference } from './commands/reference';
import { SCREEN_SPEC, runScreen } from './commands/screen';
import { RESPONSE_SPEC, runResponse } from './commands/response';
import { BUCKLING_SPEC, runBuckling } from './commands/buckling';
import { SENSITIVITY_SPEC, runSensitivity } from './commands/sensitivity';
import { REPORT_SPEC, runReport } from './commands/report';
import { VERSION } from '../version';

interface Command {
  readonly spec: CommandSpec;
  readonly run: (args: ParsedArgs) => CommandOutput;
}

const COMMANDS: Record<string, Command> = {
  modes: { spec: MODES_SPEC, run: runModes },
  export: { spec: EXPORT_SPEC, run: runExport },
  screen: { spec: SCREEN_SPEC, run: runScreen },
  response: { spec: RESPONSE_SPEC, run: runResponse },
  buckling: { spec: BUCKLING_SPEC, run: runBuckling },
  sensitivity: { spec: SENSITIVITY_SPEC, run: runSensitivity },
  report: { spec: REPORT_SPEC, run: runReport },
  reference: { spec: REFERENCE_SPEC, run: runReference },
};

function overview(): string {
  const names = Object.keys(COMMANDS);
  const w = Math.max(...names.map((n) => n.length));
  return [
    `eigenframe ${VERSION}: natural frequencies and mode shapes of frame, beam and truss models`,
    '',
    'Usage: eigenframe COMMAND [options]',
    '',
    'Commands:',
    ...names.map((n) => `  ${n.padEnd(w)}  ${COMMANDS[n].spec.summary}`),
    '',
    'Run "eigenframe COMMAND --help" for the options of a command.',
    '',
  ].join('\n');
}

/** Exit statuses: 0 success, 1 bad input or failed verification, 2 bad command line, 70 internal error. */
export const EXIT = { ok: 0, input: 1, usage: 2, internal: 70 } as const;

/** Runs the CLI on argv (without node and script); returns the exit status and output. */
export function runCli(argv: readonly string[]): { status: number; stdout: string; stderr: string } {
  const [name, ...rest] = argv;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    const topic = name === 'help' ? rest[0] : undefined;
    if (topic !== undefined && COMMANDS[topic]) return { status: EXIT.ok, stdout: commandHelp(COMMANDS[topic].spec), stderr: '' };
    if (topic !== undefined) return { status: EXIT.usage, stdout: '', stderr: `eigenframe: unknown command "${topic}"; the commands are ${Object.keys(COMMANDS).join(', ')}\n` };
    return { status: name === undefined ? EXIT.usage : EXIT.ok, stdout: name === undefined ? '' : overview(), stderr: name === undefined ? overview() : '' };
  }
  if (name === '--version' || name === '-v') return { status: EXIT.ok, stdout: `${VERSION}\n`, stderr: '' };
  const command = COMMANDS[name];
  if (!command) {
    return { status: EXIT.usage, stdout: '', stderr: `eigenframe: unknown command "${name}"; the commands are ${Object.keys(COMMANDS).join(', ')} (see eigenframe --help)\n` };
  }
  if (rest.includes('--help') || rest.includes('-h')) return { status: EXIT.ok, stdout: commandHelp(command.spec), stderr: '' };
  try {
    const args = parseArgs(command.spec, rest);
    const out = command.run(args);
    return { status: out.status ?? EXIT.ok, stdout: out.stdout, stderr: out.stderr };
  } catch (e) {
    if (e instanceof EigenframeError) {
      const usage = e.name === 'ArgumentError' && (e.path.startsWith('-') || e.path === name);
      const path = e.path === 'count' ? '--count' : e.path;
      return { status: usage ? EXIT.usage : EXIT.input, stdout: '', stderr: `eigenframe: ${path}: ${oneLine(e.detail)}\n` };
    }
    if (process.env.EIGENFRAME_DEBUG) throw e;
    const msg = e instanceof Error ? e.message : String(e);
    return { status: EXIT.internal, stdout: '', stderr: `eigenframe: internal error: ${oneLine(msg)} (please report it with the input that caused it; set EIGENFRAME_DEBUG=1 for details)\n` };
  }
}

function oneLine(s: string): string {
  return s.replace(/\s*\n\s*/g, ' ').trim();
}

/** Entry point of the `eigenframe` binary. */
export function main(): void {
  const { status, stdout, stderr } = runCli(process.argv.slice(2));
  if (stdout) process.stdout.write(stdout);
  if (stderr) process.stderr.write(stderr);
  process.exitCode = status;
}
