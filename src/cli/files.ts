/**
 * File access for the CLI: reads with errors that say what to do, and writes that never leave a
 * partial file (write to a temporary file beside the target, then rename).
 */
import { closeSync, fsyncSync, mkdirSync, openSync, readFileSync, renameSync, rmSync, statSync, writeSync } from 'node:fs';
import { dirname, basename, join } from 'node:path';
import { ArgumentError } from '../errors';

/** Reads a text file; `what` names the role (e.g. `model file`) for the message. */
export function readText(path: string, what: string): string {
  let st;
  try {
    st = statSync(path);
  } catch {
    throw new ArgumentError(`${what} not found; check the path`, path);
  }
  if (st.isDirectory()) throw new ArgumentError(`is a directory, not a ${what}; give the path of the file`, path);
  try {
    return readFileSync(path, 'utf8');
  } catch (e) {
    throw new ArgumentError(`cannot read the ${what} (${(e as NodeJS.ErrnoException).code ?? 'error'}); check its permissions`, path);
  }
}

/**
 * Writes all files or none: each goes to a temporary sibling first; only when every one is
 * written are they renamed into place.
 */
export function writeFilesAtomically(files: ReadonlyArray<{ path: string; content: string }>): void {
  const temps: string[] = [];
  try {
    for (const f of files) {
      const dir = dirname(f.path);
      try {
        mkdirSync(dir, { recursive: true });
      } catch {
        throw new ArgumentError(`cannot create the folder "${dir}"; check the path and permissions`, f.path);
      }
      if (isDirectory(f.path)) throw new ArgumentError('is a directory; give a file name to write', f.path);
      const tmp = join(dir, `.${basename(f.path)}.${process.pid}.tmp`);
      let fd: number;
      try {
        fd = openSync(tmp, 'w');
      } catch (e) {
        throw new ArgumentError(`cannot write here (${(e as NodeJS.ErrnoException).code ?? 'error'}); choose a writable folder`, f.path);
      }
      temps.push(tmp);
      try {
        writeSync(fd, f.content);
        fsyncSync(fd);
      } finally {
        closeSync(fd);
      }
    }
    files.forEach((f, k) => renameSync(temps[k], f.path));
    temps.length = 0;
  } finally {
    for (const t of temps) rmSync(t, { force: true });
  }
}

function isDirectory(path: string): boolean {
  try {
    return statSync(path).isDirectory();
  } catch {
    return false;
  }
}
