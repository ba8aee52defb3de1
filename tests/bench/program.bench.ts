// The whole-table program: a generated 20,000-line part program (4 tools: contours with arcs, G91 moves,
// drilling cycles) written for 48 stations in tool order, against reading the part program alone.
// Each run in its own child process (time and peak RSS), medians of three.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { median } from './lib';
import { generatePartProgram } from './generate-program';

interface Run { ms: number; cpuMs: number; maxRssMb: number; bytes: number }

function runChild(mode: 'read' | 'table', file: string): Run {
  const tsx = path.resolve('node_modules/.bin/tsx');
  return JSON.parse(execFileSync(tsx, ['tests/bench/program-child.ts', mode, file], { encoding: 'utf8', maxBuffer: 1 << 20 }).trim().split('\n').at(-1)!);
}

export async function run() {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'gridset-program-bench-'));
  const file = path.join(dir, 'part.nc');
  const text = generatePartProgram(20_000);
  writeFileSync(file, text);
  const read: Run[] = [];
  const table: Run[] = [];
  for (let i = 0; i < 3; i++) {
    read.push(runChild('read', file));
    table.push(runChild('table', file));
  }
  const m = (rs: Run[], k: keyof Run) => median(rs.map((r) => r[k]));
  const lines = text.split('\n').length - 1;
  console.log(`part program: ${lines.toLocaleString('en-US')} lines, ${(text.length / 1024).toFixed(0)} KB; whole-table program for 48 stations in tool order: ${(m(table, 'bytes') / 1048576).toFixed(1)} MB`);
  console.log(`reading the part program alone: median ${m(read, 'ms').toFixed(0)} ms (CPU ${m(read, 'cpuMs').toFixed(0)} ms), peak RSS ${m(read, 'maxRssMb').toFixed(0)} MB`);
  console.log(`reading + writing 48 stations:  median ${m(table, 'ms').toFixed(0)} ms (CPU ${m(table, 'cpuMs').toFixed(0)} ms), peak RSS ${m(table, 'maxRssMb').toFixed(0)} MB`);
  console.log(`ratios to reading alone: time ${(m(table, 'ms') / m(read, 'ms')).toFixed(1)}, peak RSS ${(m(table, 'maxRssMb') / m(read, 'maxRssMb')).toFixed(2)}`);
}
