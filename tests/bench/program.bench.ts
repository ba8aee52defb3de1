// The whole-table program: a generated 20,000-line part program (4 tools: contours with arcs, G91 moves,
// drilling cycles) written for 48 stations in tool order, against reading the part program alone.
// Each run in its own child process (time and peak RSS), medians of three.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { median } from './lib';

interface Run { ms: number; cpuMs: number; maxRssMb: number; bytes: number }

/** About `lines` lines of a plausible posted program, tool segments of equal length. */
export function generatePartProgram(lines: number): string {
  const out = ['%', 'O2000 (BENCH PART)', 'G20 G17 G40 G49 G80 G90 G94', 'G54'];
  const perTool = Math.floor((lines - 8) / 4);
  for (let t = 1; t <= 4; t++) {
    out.push(`T${t} M6`, 'S8000 M3', 'G0 X0.1 Y0.1', `G43 H${t} Z0.5`, 'M8');
    let n = 5;
    if (t === 3) {
      out.push('G98 G81 X0.2 Y0.2 Z-0.3 R0.1 F10.');
      for (; n < perTool - 4; n++) out.push(`X${(0.2 + (n % 40) * 0.02).toFixed(4)} Y${(0.2 + Math.floor(n / 40) % 40 * 0.02).toFixed(4)}`);
      out.push('G80');
    } else {
      out.push('G1 Z-0.05 F20.');
      for (; n < perTool - 4; n += 4) {
        const x = 0.1 + (n % 200) * 0.005;
        out.push(`G1 X${(x + 0.2).toFixed(4)} Y0.1`, `G3 X${(x + 0.4).toFixed(4)} Y0.3 I0. J0.2`, 'G91 G1 X-0.05 Y0.05', 'G90 G1 Y0.1');
      }
    }
    out.push('G0 Z0.5', 'M9', 'G91 G28 Z0', 'G90');
  }
  out.push('M30', '%');
  return out.join('\n') + '\n';
}

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
