/**
 * A small, strict command-line parser: every option is declared, unknown ones are errors, values
 * are checked by type before any work starts.
 */
import { ArgumentError } from '../errors';

/** Kinds of option value. `flag` takes none. */
export type OptionKind = 'flag' | 'string' | 'count' | 'number' | 'file';

export interface OptionSpec {
  readonly name: string;
  readonly kind: OptionKind;
  /** Placeholder shown in help, e.g. `N`. */
  readonly value?: string;
  readonly help: string;
}

export interface CommandSpec {
  readonly name: string;
  readonly summary: string;
  /** Usage lines without the program name. */
  readonly usage: readonly string[];
  /** Name of the positional argument(s) accepted, shown in help; empty: none accepted. */
  readonly positionals: { readonly name: string; readonly max: number };
  readonly options: readonly OptionSpec[];
  /** Extra help paragraphs. */
  readonly notes?: readonly string[];
}

export interface ParsedArgs {
  readonly positionals: string[];
  readonly options: Record<string, string | number | boolean>;
}

/** Parses argv (after the command name) against the spec; throws ArgumentError naming the option. */
export function parseArgs(spec: CommandSpec, argv: readonly string[]): ParsedArgs {
  const positionals: string[] = [];
  const options: Record<string, string | number | boolean> = {};
  const byName = new Map(spec.options.map((o) => [o.name, o]));
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    if (arg === '--') {
      positionals.push(...argv.slice(i + 1));
      break;
    }
    if (arg.startsWith('--')) {
      const eq = arg.indexOf('=');
      const name = eq > 0 ? arg.slice(2, eq) : arg.slice(2);
      const opt = byName.get(name);
      if (!opt) {
        throw new ArgumentError(`unknown option for "${spec.name}"; run "eigenframe ${spec.name} --help" for the options`, `--${name}`);
      }
      if (name in options) throw new ArgumentError('given twice; give it once', `--${name}`);
      if (opt.kind === 'flag') {
        if (eq > 0) throw new ArgumentError('takes no value; write it alone', `--${name}`);
        options[name] = true;
        continue;
      }
      let raw: string | undefined;
      if (eq > 0) raw = arg.slice(eq + 1);
      else {
        raw = argv[i + 1];
        if (raw === undefined || (raw.startsWith('--') && raw.length > 2)) {
          throw new ArgumentError(`needs a value (${opt.value ?? 'VALUE'}); write --${name} ${opt.value ?? 'VALUE'}`, `--${name}`);
        }
        i++;
      }
      options[name] = convert(opt, raw);
    } else if (arg.startsWith('-') && arg.length > 1 && !/^-\d/.test(arg)) {
      throw new ArgumentError(`unknown option for "${spec.name}"; options are written with two dashes, run "eigenframe ${spec.name} --help"`, arg);
    } else {
      positionals.push(arg);
    }
  }
  if (positionals.length > spec.positionals.max) {
    const extra = positionals[spec.positionals.max];
    throw new ArgumentError(
      spec.positionals.max === 0
        ? `"${spec.name}" takes no ${spec.positionals.name}; remove "${extra}"`
        : `unexpected extra argument "${extra}"; "${spec.name}" takes at most ${spec.positionals.max} ${spec.positionals.name}`,
      extra,
    );
  }
  return { positionals, options };
}

function convert(opt: OptionSpec, raw: string): string | number {
  const where = `--${opt.name}`;
  switch (opt.kind) {
    case 'count': {
      if (/^-\d+$/.test(raw.trim())) throw new ArgumentError(`${raw.trim()} is out of range; give a positive integer such as 10`, where);
      if (!/^[+]?\d+$/.test(raw.trim())) {
        throw new ArgumentError(`"${raw}" is not a whole number; give a positive integer such as 10`, where);
      }
      const v = Number(raw);
      if (!Number.isSafeInteger(v) || v < 1) throw new ArgumentError(`${raw} is out of range; give a positive integer such as 10`, where);
      return v;
    }
    case 'number': {
      const v = Number(raw);
      if (raw.trim() === '' || !Number.isFinite(v)) throw new ArgumentError(`"${raw}" is not a finite number; give a number such as 2.5`, where);
      return v;
    }
    case 'string':
    case 'file':
      if (raw === '') throw new ArgumentError(`is empty; give ${opt.value ?? 'a value'}`, where);
      return raw;
    default:
      return raw;
  }
}

/** Help text of one command. */
export function commandHelp(spec: CommandSpec): string {
  const lines = [`eigenframe ${spec.name}: ${spec.summary}`, '', 'Usage:'];
  for (const u of spec.usage) lines.push(`  eigenframe ${u}`);
  if (spec.options.length) {
    lines.push('', 'Options:');
    const labels = spec.options.map((o) => `--${o.name}${o.kind === 'flag' ? '' : ` ${o.value ?? 'VALUE'}`}`);
    const w = Math.max(...labels.map((l) => l.length), 10);
    spec.options.forEach((o, k) => lines.push(`  ${labels[k].padEnd(w)}  ${o.help}`));
  }
  if (spec.notes?.length) {
    lines.push('');
    for (const n of spec.notes) lines.push(n);
  }
  return lines.join('\n') + '\n';
}
