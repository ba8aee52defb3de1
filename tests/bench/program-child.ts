// One measured run in its own process, so peak RSS belongs to that run alone:
// `tsx tests/bench/program-child.ts read|table <file>` prints {ms, cpuMs, maxRssMb, bytes}.
import { readFileSync } from 'node:fs';
import { readPartProgram } from '../../shared/gcode/read-part-program';
import { expandedProgram } from '../../shared/gcode/expand-program';
import { evaluateTemplate } from '../../shared/stations/evaluate-template';
import { railBandsWithStations } from '../shared/station-fixtures';

const [mode, file] = process.argv.slice(2);
const text = readFileSync(file!, 'utf8');
const stations = evaluateTemplate(railBandsWithStations(1, 48)).stations;
const cpu0 = process.cpuUsage();
const t0 = performance.now();
const read = readPartProgram(text, 'in');
if (!read.ok) throw new Error(read.error.message);
let bytes = text.length;
if (mode === 'table') {
  const out = expandedProgram({ program: read.program, unit: 'in', stations, order: 'tool', safeZ: 2, header: { templateName: 'Bench', version: 1, state: 'released', contentHash: 'x', jobId: 1, jobName: 'Bench', partNumber: 'P', programSha256: 'y', family: 'EXPANDED', skipped: [] } });
  if (!out.ok) throw new Error(out.message);
  bytes = out.text.length;
}
const ms = performance.now() - t0;
const cpu = process.cpuUsage(cpu0);
console.log(JSON.stringify({ ms, cpuMs: (cpu.user + cpu.system) / 1000, maxRssMb: process.resourceUsage().maxRSS / 1024, bytes }));
