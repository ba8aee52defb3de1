// DXF inspection of a generated 20 MB file against a bare dxf-parser parse of the same text,
// each in its own child process (time and peak RSS), medians of three runs; then the export of a
// 500-station template drawing.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { generateLargeDxf } from './generate-dxf';
import { median, timeMedian } from './lib';
import { railBandsWithStations } from '../shared/station-fixtures';
import { evaluateTemplate } from '../../shared/stations/evaluate-template';
import { templateDrawing } from '../../server/services/template-drawing';
import { writeDrawingDxf } from '../../server/dxf/write-dxf';

interface Run { ms: number; cpuMs: number; maxRssMb: number; entities: number }

function runChild(mode: 'bare' | 'inspect', file: string): Run {
  const tsx = path.resolve('node_modules/.bin/tsx');
  return JSON.parse(execFileSync(tsx, ['tests/bench/dxf-child.ts', mode, file], { encoding: 'utf8', maxBuffer: 1 << 20 }).trim().split('\n').at(-1)!);
}

export async function run() {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'gridset-dxf-bench-'));
  const file = path.join(dir, 'large.dxf');
  const text = generateLargeDxf(20 * 1024 * 1024);
  writeFileSync(file, text);
  const bare: Run[] = [];
  const inspect: Run[] = [];
  for (let i = 0; i < 3; i++) {
    bare.push(runChild('bare', file));
    inspect.push(runChild('inspect', file));
  }
  const m = (runs: Run[], k: keyof Run) => median(runs.map((r) => r[k]));
  console.log(`20 MB DXF (${(text.length / 1024 / 1024).toFixed(1)} MB, ${inspect[0]!.entities} entities after block expansion)`);
  console.log(`  bare dxf-parser: ${m(bare, 'ms').toFixed(0)} ms wall, ${m(bare, 'cpuMs').toFixed(0)} ms CPU, peak RSS ${m(bare, 'maxRssMb').toFixed(0)} MB`);
  console.log(`  inspectDxf:      ${m(inspect, 'ms').toFixed(0)} ms wall, ${m(inspect, 'cpuMs').toFixed(0)} ms CPU, peak RSS ${m(inspect, 'maxRssMb').toFixed(0)} MB`);
  console.log(`  ratios: time ${(m(inspect, 'ms') / m(bare, 'ms')).toFixed(2)} (CPU ${(m(inspect, 'cpuMs') / m(bare, 'cpuMs')).toFixed(2)}), peak RSS ${(m(inspect, 'maxRssMb') / m(bare, 'maxRssMb')).toFixed(2)} (targets <= 1.5)`);

  const content = railBandsWithStations(4, 500);
  const evaluation = evaluateTemplate(content);
  let bytes = 0;
  const exportMs = await timeMedian(7, () => { bytes = writeDrawingDxf(templateDrawing(content, evaluation)).length; });
  console.log(`drawing.dxf of a ${evaluation.stations.length}-station template: median ${exportMs.toFixed(0)} ms (target < 1000 ms), ${(bytes / 1024).toFixed(0)} KB`);
}
