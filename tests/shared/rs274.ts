// LinuxCNC's interpreter as the outside reader of G-code (STACK-NOTES, "LinuxCNC's interpreter as a G-code reference"):
// `rs274 -t tools.tbl -g file.ngc` prints one canonical machine command per line, or an error line and the offending block.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';

export interface Canon { kind: string; args: number[]; text: string }

/** rs274's output: one canonical machine command a line ("  12 N..... NAME(args)"), anything else an error line. */
export function parseCanon(out: string): { canon: Canon[]; errors: string[] } {
  const canon: Canon[] = [];
  const errors: string[] = [];
  for (const line of out.split('\n')) {
    const m = /^\s*\d+ N\.{5} ([A-Z0-9_]+)\((.*)\)\s*$/.exec(line);
    if (m) canon.push({ kind: m[1]!, args: m[2]!.split(/[ ,]+/).map(Number).filter((v) => !Number.isNaN(v)), text: m[2]! });
    else if (line.trim() && line.trim() !== 'executing') errors.push(line);
  }
  return { canon, errors };
}

/** A tool table line per LinuxCNC's format: `T1 P1 Z1.0 D0.25`. */
/** Each run has its own HOME and folder: rs274 keeps its tool table in $HOME/.tool.mmap, which parallel runs would share. */
export function runRs274(program: string, tools: { t: number; z: number; d: number }[]): { canon: Canon[]; errors: string[] } {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'rs274-'));
  try {
    writeFileSync(path.join(dir, 'tools.tbl'), tools.map((t) => `T${t.t} P${t.t} Z${t.z} D${t.d} ;test tool`).join('\n') + '\n');
    writeFileSync(path.join(dir, 'p.ngc'), program);
    const errors: string[] = [];
    let out: string;
    try {
      out = execFileSync('/usr/bin/rs274', ['-t', path.join(dir, 'tools.tbl'), '-g', path.join(dir, 'p.ngc')], { encoding: 'utf8', maxBuffer: 512 * 1024 * 1024, stdio: ['ignore', 'pipe', 'pipe'], cwd: dir, env: { ...process.env, HOME: dir } });
    } catch (e) {
      const err = e as { stdout?: string; stderr?: string; status?: number };
      out = `${err.stdout ?? ''}\n${err.stderr ?? ''}`;
      errors.push(`rs274 exited with status ${err.status}`);
    }
    const parsed = parseCanon(out);
    return { canon: parsed.canon, errors: [...errors, ...parsed.errors] };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

export interface Move { kind: 'traverse' | 'feed' | 'arc'; x: number; y: number; z: number; cx?: number; cy?: number; turn?: number }

/** Moves in order, with the tool-change count before each (CHANGE_TOOL lines). */
export function movesOf(canon: Canon[]): { moves: Move[]; toolChanges: number[]; changeIndex: number[] } {
  const moves: Move[] = [];
  const toolChanges: number[] = [];
  const changeIndex: number[] = [];
  let selected = NaN;
  for (const c of canon) {
    if (c.kind === 'STRAIGHT_TRAVERSE') moves.push({ kind: 'traverse', x: c.args[0]!, y: c.args[1]!, z: c.args[2]! });
    else if (c.kind === 'STRAIGHT_FEED') moves.push({ kind: 'feed', x: c.args[0]!, y: c.args[1]!, z: c.args[2]! });
    // ARC_FEED(first_end, second_end, first_axis, second_axis, rotation, axis_end_point, a, b, c)
    else if (c.kind === 'ARC_FEED') moves.push({ kind: 'arc', x: c.args[0]!, y: c.args[1]!, cx: c.args[2]!, cy: c.args[3]!, turn: c.args[4]!, z: c.args[5]! });
    // CHANGE_TOOL names the tool-table slot; the tool number is the one SELECT_TOOL (the T word) chose before it.
    else if (c.kind === 'SELECT_TOOL') selected = c.args[0]!;
    else if (c.kind === 'CHANGE_TOOL') { toolChanges.push(selected); changeIndex.push(moves.length); }
  }
  return { moves, toolChanges, changeIndex };
}

/**
 * Moves in the coordinates of the work offset in force at the start (G54 with zero offsets in rs274), from the
 * active-system positions rs274 prints and the offsets it announces: a point p is at g5x + R(rotation)·(p + g92)
 * (LinuxCNC emccanon.cc, rotate_and_offset_pos, from memory), where G52 shows as SET_G92_OFFSET and G10 L2 R as
 * SET_XY_ROTATION.
 */
export function movesInStartFrame(canon: Canon[]): Move[] {
  let g5x = { x: 0, y: 0, z: 0 };
  let g92 = { x: 0, y: 0, z: 0 };
  let rot = 0;
  const out: Move[] = [];
  const at = (x: number, y: number, z: number) => {
    const r = (rot * Math.PI) / 180;
    const px = x + g92.x, py = y + g92.y;
    return { x: g5x.x + Math.cos(r) * px - Math.sin(r) * py, y: g5x.y + Math.sin(r) * px + Math.cos(r) * py, z: g5x.z + z + g92.z };
  };
  for (const c of canon) {
    if (c.kind === 'SET_G5X_OFFSET') g5x = { x: c.args[1]!, y: c.args[2]!, z: c.args[3]! };
    else if (c.kind === 'SET_G92_OFFSET') g92 = { x: c.args[0]!, y: c.args[1]!, z: c.args[2]! };
    else if (c.kind === 'SET_XY_ROTATION') rot = c.args[0]!;
    else {
      const [m] = movesOf([c]).moves;
      if (!m) continue;
      const e = at(m.x, m.y, m.z);
      const moved: Move = { ...m, ...e };
      if (m.kind === 'arc') {
        const cc = at(m.cx!, m.cy!, 0);
        moved.cx = cc.x; moved.cy = cc.y;
      }
      out.push(moved);
    }
  }
  return out;
}
