import { useEffect, useState } from 'react';
import type { NamingTarget } from '../../../../shared/schemas/naming';
import { inputClass } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { useCheckName } from '../api';

/** Type a name, see at once which token fails and why (the server checks with the convention in force). */
export function NameTester() {
  const [target, setTarget] = useState<NamingTarget>('layer');
  const [name, setName] = useState('');
  const check = useCheckName();
  const { mutate } = check;
  useEffect(() => {
    if (!name.trim()) return;
    const t = setTimeout(() => mutate({ target, name }), 200);
    return () => clearTimeout(t);
  }, [name, target, mutate]);
  const result = name.trim() ? check.data : undefined;
  return (
    <section className="flex flex-col gap-3 rounded border border-slate-300 bg-white p-4" aria-labelledby="tester-title">
      <h2 id="tester-title" className="text-lg font-semibold">Try a name</h2>
      <div className="flex flex-wrap gap-3">
        <label className="flex flex-col text-sm font-semibold text-slate-700">It is a
          <select className={`${inputClass} w-48`} value={target} onChange={(e) => setTarget(e.target.value as NamingTarget)}>
            <option value="layer">layer name</option>
            <option value="component">component code</option>
          </select>
        </label>
        <label className="flex flex-1 flex-col text-sm font-semibold text-slate-700">Name
          <input className={`${inputClass} font-mono`} value={name} onChange={(e) => setName(e.target.value)} placeholder={target === 'layer' ? 'FX-CR-8' : 'JR-1.000'} />
        </label>
      </div>
      {check.error ? <Notice tone="danger" title={check.error.message} /> : null}
      {result ? (
        result.ok ? <Notice tone="info" title={`"${name}" fits the convention.`} /> : (
          <Notice tone="warning" title={`"${name}" does not fit the convention`}>
            <ul className="list-disc pl-5">
              {result.problems.map((p, i) => <li key={i}>{p.token ? <span className="font-mono font-semibold">{p.token}: </span> : null}{p.message}</li>)}
            </ul>
          </Notice>
        )
      ) : null}
    </section>
  );
}
