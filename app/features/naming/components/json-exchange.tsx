import { useId, useState } from 'react';
import { Download, Upload } from 'lucide-react';
import { Button } from '../../../components/ui/button';
import { FilePicker } from '../../../components/ui/file-picker';
import { inputClass } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { loadRulesJson, rulesJson, type RulesDraft } from '../rule-draft';

/** Rules files are a few kilobytes; a larger file is not one. */
const MAX_JSON_BYTES = 512 * 1024;

/**
 * The rules as JSON, for those who keep them in a file or move them between shops: the form's
 * rules shown (and downloadable) as JSON, and JSON pasted or read from a file loaded into the form,
 * where its problems show on their fields before anything is saved.
 */
export function JsonExchange({ rules, onLoad }: { rules: RulesDraft; onLoad: (rules: RulesDraft) => void }) {
  const [text, setText] = useState('');
  const [message, setMessage] = useState<{ tone: 'danger' | 'info'; text: string } | null>(null);
  const areaId = useId();

  const load = (source: string) => {
    const loaded = loadRulesJson(source);
    if (!loaded.ok) return setMessage({ tone: 'danger', text: loaded.message });
    onLoad(loaded.rules);
    setMessage({ tone: 'info', text: 'The JSON is in the form above; check the fields, then save.' });
  };
  const readFile = async (file: File | undefined) => {
    if (!file) return;
    if (file.size > MAX_JSON_BYTES) return setMessage({ tone: 'danger', text: `${file.name} is ${Math.ceil(file.size / 1024)} KB; a rules file is at most ${MAX_JSON_BYTES / 1024} KB. Choose the JSON file of the rules.` });
    const source = await file.text();
    setText(source);
    load(source);
  };
  const download = () => {
    const href = URL.createObjectURL(new Blob([rulesJson(rules)], { type: 'application/json' }));
    const a = document.createElement('a');
    a.href = href;
    a.download = 'naming-rules.json';
    document.body.append(a);
    a.click();
    a.remove();
    setTimeout(() => URL.revokeObjectURL(href), 10_000);
  };

  return (
    <details className="min-w-0 rounded border border-slate-300 bg-white p-4" onToggle={(e) => { if ((e.target as HTMLDetailsElement).open && !text) setText(rulesJson(rules)); }}>
      <summary className="cursor-pointer font-semibold">The rules as JSON (import and export)</summary>
      <div className="mt-3 flex flex-col gap-3">
        <label htmlFor={areaId} className="text-sm font-semibold text-slate-700">JSON of the two rules, as the API takes them</label>
        <textarea id={areaId} className={`${inputClass} min-h-64 font-mono text-[15px]`} value={text} onChange={(e) => setText(e.target.value)} spellCheck={false} />
        {message ? <Notice tone={message.tone} title={message.text} /> : null}
        <div className="flex flex-wrap gap-2">
          <Button variant="secondary" onClick={() => load(text)}><Upload aria-hidden className="h-4 w-4" />Load this JSON into the form</Button>
          <Button variant="secondary" onClick={() => { setText(rulesJson(rules)); setMessage(null); }}>Show the form's rules here</Button>
          <Button variant="secondary" onClick={download}><Download aria-hidden className="h-4 w-4" />Download as a file</Button>
        </div>
        <FilePicker label="Or read a JSON file into the form" buttonLabel="Choose a JSON file" accept=".json,application/json" onFile={(f) => void readFile(f)} />
      </div>
    </details>
  );
}
