// One measured run in its own process, so peak RSS belongs to that run alone:
// `tsx tests/bench/dxf-child.ts bare|inspect <file>` prints {ms, cpuMs, maxRssMb, entities}.
import { readFileSync } from 'node:fs';
import DxfParser from 'dxf-parser';
import { inspectDxf } from '../../server/dxf/read-dxf';

const [mode, file] = process.argv.slice(2);
const text = readFileSync(file!, 'utf8');
const cpu0 = process.cpuUsage();
const t0 = performance.now();
let entities = 0;
if (mode === 'bare') entities = new DxfParser().parseSync(text)!.entities.length;
else entities = inspectDxf(text).expandedEntities;
const ms = performance.now() - t0;
const cpu = process.cpuUsage(cpu0);
console.log(JSON.stringify({ ms, cpuMs: (cpu.user + cpu.system) / 1000, maxRssMb: process.resourceUsage().maxRSS / 1024, entities }));
