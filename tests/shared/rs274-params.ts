// LinuxCNC's interpreter as the outside reader of offset files (STACK-NOTES, "LinuxCNC's interpreter as a
// G-code reference"; "rs274 state across files"). `rs274 -v FILE -g PROGRAM` reads the parameter file before
// the program and writes it back after, so two runs sharing one file show what the first leaves for the second.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { parseCanon } from './rs274';

export const RS274 = process.env.RS274_PATH ?? '/usr/bin/rs274';

export interface Rs274Run {
  /** Canonical commands, e.g. { name: 'SET_G92_OFFSET', args: [1, 2, 0, 0, 0, 0] }. */
  canon: Array<{ name: string; args: number[] }>;
  /** Lines that are neither canonical commands nor the "executing" banner: the interpreter's errors. */
  errors: string[];
}

export interface Rs274Session {
  run(program: string): Rs274Run;
  /** Numbered parameters as the interpreter saved them after the last run (lengths in inches, this build). */
  params(): Map<number, number>;
  close(): void;
}

/** A folder with one parameter file that successive runs share, as a control's memory does across programs. */
export function rs274Session(): Rs274Session {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'rs274-params-'));
  const vars = path.join(dir, 'params.var');
  writeFileSync(vars, '');
  let n = 0;
  return {
    run(program) {
      const file = path.join(dir, `p${++n}.ngc`);
      writeFileSync(file, program);
      let out: string;
      try {
        out = execFileSync(RS274, ['-v', vars, '-g', file], { encoding: 'utf8', cwd: dir, env: { ...process.env, HOME: dir }, stdio: ['ignore', 'pipe', 'pipe'] });
      } catch (e) {
        const err = e as { stdout?: string; stderr?: string; status?: number };
        return { canon: [], errors: [`rs274 exited with status ${err.status}`, err.stdout ?? '', err.stderr ?? ''] };
      }
      const parsed = parseCanon(out);
      return { canon: parsed.canon.map((c) => ({ name: c.kind, args: c.args })), errors: parsed.errors };
    },
    params() {
      const map = new Map<number, number>();
      for (const line of readFileSync(vars, 'utf8').split('\n')) {
        const [k, v] = line.trim().split(/\s+/);
        if (k && v) map.set(Number(k), Number(v));
      }
      return map;
    },
    close() {
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

/** G10 L2 register P's parameters: #5201+20·P X, +1 Y, +2 Z, #5210+20·P the rotation R (LinuxCNC "Numbered Parameters"). */
export const registerParams = (p: number) => ({ x: 5201 + 20 * p, y: 5202 + 20 * p, z: 5203 + 20 * p, r: 5210 + 20 * p });
/** The G92 / G52 offset: #5211 X, #5212 Y, #5213 Z (LinuxCNC "Numbered Parameters"). */
export const G92_PARAMS = { x: 5211, y: 5212, z: 5213 } as const;
