import { readFileSync } from 'node:fs';
import { inspectDxf } from '../server/dxf/read-dxf';
const text = readFileSync('/tmp/bnd/stuck.dxf').toString('utf8');
const t = Date.now();
try { const r = inspectDxf(text); console.log('ok', Date.now() - t, r.outline.paths.length); } catch (e) { console.log('threw', Date.now() - t, (e as Error).message); }
