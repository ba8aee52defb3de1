import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/**
 * Runs a G-code file through LinuxCNC's interpreter (`rs274 -g FILE`, Debian linuxcnc-uspace),
 * an independent reader of RS274/NGC (NISTIR 6556). Returns the canonical-command lines;
 * throws on a non-zero exit or any error line rs274 prints. `params`: one parameter file
 * (`-v`) shared between runs, to see what one file leaves for the next; `tools`: a tool table (`-t`).
 * RS274_PATH overrides the binary.
 */
export interface Rs274Run { lines: string[]; messages: string[] }

export const RS274 = process.env.RS274_PATH ?? '/usr/bin/rs274';

export function rs274(gcode: string, opts: { params?: string; tools?: string; dir?: string } = {}): Rs274Run {
  const dir = opts.dir ?? mkdtempSync(join(tmpdir(), 'rs274-'));
  const file = join(dir, 'program.ngc');
  writeFileSync(file, gcode);
  const args = [...(opts.params ? ['-v', opts.params] : []), ...(opts.tools ? ['-t', opts.tools] : []), '-g', file];
  const r = spawnSync(RS274, args, { cwd: dir, encoding: 'utf8', timeout: 20_000 });
  if (r.error) throw r.error;
  // rs274 prints "executing" on stderr, then any error message and the offending block.
  const errors = (r.stderr ?? '').split('\n').map((l) => l.trim()).filter((l) => l && l !== 'executing');
  if (r.status !== 0 || errors.length) throw new Error(`rs274 refused the file (exit ${r.status}): ${errors.join(' | ')}`);
  const lines = (r.stdout ?? '').split('\n').filter(Boolean).map((l) => l.replace(/^\s*\d+\s+N\.+\s*/, ''));
  const messages = lines.flatMap((l) => /^MESSAGE\("(.*)"\)$/.exec(l)?.[1] ?? []);
  return { lines, messages };
}

/** A fresh, empty parameter file for `-v` in its own temp dir. */
export function paramFile(): { dir: string; file: string } {
  const dir = mkdtempSync(join(tmpdir(), 'rs274-vars-'));
  const file = join(dir, 'params.var');
  writeFileSync(file, '');
  return { dir, file };
}

/** `(DEBUG,#n)` lines that print parameters as MESSAGE lines, in the order given (LinuxCNC "Comments", DEBUG). */
export const debugParams = (ns: readonly number[]) => ns.map((n) => `(DEBUG,#${n})`).join('\n');
