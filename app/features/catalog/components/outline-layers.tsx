import { useId } from 'react';
import { AlertTriangle, CheckCircle2 } from 'lucide-react';
import type { NamingRule } from '../../../../shared/schemas/naming';
import { checkName } from '../../../../shared/naming/check-name';
import { Button } from '../../../components/ui/button';
import { inputClass } from '../../../components/ui/field';
import type { DxfInspection } from '../dxf-inspection';
import type { LayerRefusals } from '../outline-import-state';
import { targetName } from '../outline-preview';

interface LayerMappingProps {
  inspection: DxfInspection;
  mapping: Record<string, string>;
  refusals: LayerRefusals;
  layerRule?: NamingRule;
  componentLayer: string;
  onChange: (layer: string, value: string) => void;
  onAll: (value: string) => void;
}

/** Each file layer and the conforming name it is stored under, checked against the layer rule as typed. */
export function LayerMapping({ inspection, mapping, refusals, layerRule, componentLayer, onChange, onAll }: LayerMappingProps) {
  const id = useId();
  const layers = inspection.layers.filter((l) => l.name in mapping);
  if (layers.length === 0) return null;
  return (
    <section className="flex flex-col gap-2" aria-labelledby={`${id}-h`}>
      <div className="flex flex-wrap items-end justify-between gap-2">
        <div>
          <h3 id={`${id}-h`} className="font-semibold">Layers as stored</h3>
          <p className="text-sm text-slate-600">Each layer of the file takes a name that fits the shop's naming convention. Leave a field empty to keep the file's name.</p>
        </div>
        {componentLayer ? <Button variant="secondary" onClick={() => onAll(componentLayer)}>Put every layer on {componentLayer}</Button> : null}
      </div>
      <div className="overflow-x-auto">
      <table className="w-full border-collapse text-[15px]">
        <caption className="sr-only">File layers and the names they are stored under</caption>
        <thead className="bg-slate-100 text-sm text-slate-700">
          <tr>
            <th scope="col" className="px-3 py-1 text-left">File layer</th>
            <th scope="col" className="px-3 py-1 text-right">Entities</th>
            <th scope="col" className="px-3 py-1 text-left">Stored as</th>
            <th scope="col" className="px-3 py-1 text-left">Naming convention</th>
          </tr>
        </thead>
        <tbody>
          {layers.map((l, row) => {
            const target = targetName(l.name, mapping);
            const refused = refusals[l.name]?.target === target ? refusals[l.name]!.problems : null;
            const check = refused ? { ok: false, problems: refused } : layerRule ? checkName(layerRule, target, 'layer') : target === l.name ? { ok: l.ok, problems: l.problems } : null;
            const msgId = `${id}-check-${row}`; // layer names may hold spaces, which an id list cannot
            return (
              <tr key={l.name} className="border-t border-slate-200 align-top">
                <td className="min-w-40 px-3 py-2">
                  <span className="break-all font-mono">{l.name}</span>
                  {!l.ok ? <p className="text-sm text-slate-600">does not fit{l.proposed ? `; proposed ${l.proposed}` : '; no name proposed'}</p> : null}
                </td>
                <td className="num px-3 py-2">{l.entities}</td>
                <td className="px-3 py-1">
                  <input className={`${inputClass} min-w-44 font-mono`} value={mapping[l.name] ?? ''} placeholder={l.name}
                    onChange={(e) => onChange(l.name, e.target.value)} aria-label={`Conforming name for layer ${l.name}`}
                    aria-invalid={check ? !check.ok : undefined} aria-describedby={msgId} spellCheck={false} autoCapitalize="characters" />
                </td>
                <td id={msgId} className="px-3 py-2 text-sm">
                  {check === null ? (
                    <span className="text-slate-600">checked when the outline is used</span>
                  ) : check.ok ? (
                    <span className="inline-flex items-center gap-1 text-safe-700"><CheckCircle2 aria-hidden className="h-4 w-4" />fits</span>
                  ) : (
                    <div role={refused ? 'alert' : undefined} className="flex flex-col gap-0.5 text-danger-700">
                      <span className="inline-flex items-center gap-1 font-semibold"><AlertTriangle aria-hidden className="h-4 w-4" />{refused ? 'refused: does not fit' : 'does not fit'}</span>
                      {check.problems.map((p, k) => <span key={k}>{p.message}</span>)}
                    </div>
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      </div>
    </section>
  );
}
