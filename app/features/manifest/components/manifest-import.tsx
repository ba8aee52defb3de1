import { useState } from 'react';
import { ArrowRight, Download, Upload } from 'lucide-react';
import { Button } from '../../../components/ui/button';
import { FilePicker } from '../../../components/ui/file-picker';
import { ErrorText, Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import type { ManifestAnswer, ManifestChange } from '../../../../shared/schemas/manifest';
import { useCommitManifest, usePreviewManifest } from '../api';

const ACTION_WORDS = { add: 'will be added', change: 'will change', same: 'same as the catalog' } as const;

/** Each changed field of a row, old → new, as the workbook's cells write them. */
function FieldChanges({ change }: { change: ManifestChange }) {
  if (change.action === 'add') return <span className="text-slate-600">new row</span>;
  return (
    <ul className="flex flex-col gap-0.5">
      {change.values.map((v) => (
        <li key={v.field} className="flex flex-wrap items-baseline gap-x-2">
          <span className="font-semibold">{v.field}</span>
          <span className="break-all font-mono text-slate-700">{v.from === '' ? '(empty)' : v.from}</span>
          <ArrowRight aria-label="to" className="h-4 w-4 self-center" />
          <span className="break-all font-mono font-semibold">{v.to === '' ? '(empty)' : v.to}</span>
        </li>
      ))}
    </ul>
  );
}

/**
 * The lead downloads the catalog as a workbook, edits it, and brings it back: every row is
 * checked and shown before one transaction writes it; with any error nothing is written.
 * Once imported, the preview and its button leave the screen (the chosen file's name is cleared too), so
 * an old preview is never imported twice or read as still pending.
 */
export function ManifestImport({ canWrite, onCommitted }: { canWrite: boolean; onCommitted: () => Promise<unknown> }) {
  const [file, setFile] = useState<File | null>(null);
  const [imported, setImported] = useState<string | null>(null);
  const [progress, setProgress] = useState(0);
  const preview = usePreviewManifest(setProgress);
  const commit = useCommitManifest(setProgress, onCommitted);
  const answer: ManifestAnswer | undefined = preview.data;
  const commitErrors = commit.error instanceof ApiError ? ((commit.error.details as { errors?: ManifestAnswer['errors'] } | null)?.errors ?? []) : [];
  const errors = [...(answer?.errors ?? []), ...commitErrors];
  const changes = answer?.changes.filter((c) => c.action !== 'same') ?? [];
  const runCommit = (f: File) => commit.mutate(f, {
    onSuccess: (done) => {
      const n = done.changes.filter((c) => c.action !== 'same').length;
      setImported(`Imported ${n} change${n === 1 ? '' : 's'} from ${f.name}. The catalog now matches the manifest.`);
      setFile(null);
      preview.reset();
    },
  });
  return (
    <section className="flex flex-col gap-3 rounded border border-slate-300 bg-white p-4" aria-labelledby="manifest-title">
      <h2 id="manifest-title" className="text-lg font-semibold">Manifest spreadsheet</h2>
      <p className="text-slate-700">The catalog as an XLSX workbook (Components and Layers sheets). Edit it in a spreadsheet and bring it back: you see every change before anything is written.</p>
      <div><a className="inline-flex min-h-10 items-center gap-2 rounded border border-slate-400 bg-white px-3 font-semibold hover:bg-slate-100" href="/api/manifest.xlsx" download><Download aria-hidden className="h-4 w-4" />Download the manifest</a></div>
      {canWrite ? (
        <>
          <FilePicker label="Bring back an edited manifest (.xlsx or .csv)" buttonLabel="Choose the workbook"
            accept=".xlsx,.csv,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet,text/csv" chosen={file?.name ?? null}
            onFile={(f) => { setFile(f); setImported(null); commit.reset(); preview.mutate(f); }} />
          {preview.isPending || commit.isPending ? <progress className="w-64 max-w-full" max={1} value={progress} aria-label="Upload progress" /> : null}
          {imported ? <Notice tone="info" title={imported} /> : null}
          <ErrorText error={preview.error} />
          {answer ? (
            <div className="flex flex-col gap-2">
              <p className="font-semibold">{answer.changes.length} rows read: {changes.filter((c) => c.action === 'add').length} to add, {changes.filter((c) => c.action === 'change').length} to change, {answer.changes.length - changes.length} the same · {errors.length} problem{errors.length === 1 ? '' : 's'}</p>
              {errors.length ? (
                <table className="stack-sm w-full border-collapse text-[15px]">
                  <caption className="mb-1 text-left font-semibold text-danger-700">Fix these in the workbook; nothing is written while any remain</caption>
                  <thead className="bg-slate-100"><tr><th className="px-2 py-1 text-left">Sheet</th><th className="px-2 py-1 text-left">Cell</th><th className="px-2 py-1 text-left">Problem</th></tr></thead>
                  <tbody>{errors.slice(0, 200).map((e, i) => <tr key={i} className="border-t border-slate-200"><td data-label="Sheet" className="px-2 py-1">{e.sheet ?? '—'}</td><td data-label="Cell" className="px-2 py-1 font-mono">{e.column ?? ''}{e.row ?? ''}</td><td data-label="Problem" className="px-2 py-1">{e.message}</td></tr>)}</tbody>
                </table>
              ) : null}
              {changes.length ? (
                <table className="stack-sm w-full border-collapse text-[15px]">
                  <caption className="mb-1 text-left font-semibold">What the import will do</caption>
                  <thead className="bg-slate-100"><tr><th className="px-2 py-1 text-left">Row</th><th className="px-2 py-1 text-left">Code</th><th className="px-2 py-1 text-left">Change</th><th className="px-2 py-1 text-left">Old → new</th></tr></thead>
                  <tbody>{changes.map((c) => (
                    <tr key={`${c.sheet}-${c.row}`} className="border-t border-slate-200 align-top">
                      <td data-label="Row" className="num px-2 py-1">{c.sheet} {c.row}</td><td data-label="Code" className="px-2 py-1 font-mono">{c.code}</td>
                      <td data-label="Change" className="px-2 py-1">{ACTION_WORDS[c.action]}</td><td data-label="Old → new" className="px-2 py-1"><FieldChanges change={c} /></td>
                    </tr>
                  ))}</tbody>
                </table>
              ) : errors.length ? null : <Notice tone="info" title="Every row is the same as the catalog; there is nothing to import." />}
              {file && !errors.length && changes.length ? (
                <div><Button onClick={() => runCommit(file)} disabled={commit.isPending}><Upload aria-hidden className="h-4 w-4" />Import {changes.length} change{changes.length === 1 ? '' : 's'}</Button></div>
              ) : null}
              {commit.error && !commitErrors.length ? <ErrorText error={commit.error} /> : null}
            </div>
          ) : null}
        </>
      ) : null}
    </section>
  );
}
