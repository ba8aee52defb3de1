import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { may } from '../../shared/schemas/auth';
import { CreateTemplateInputSchema, type CreateTemplateInput, type TemplateSummary } from '../../shared/schemas/template-api';
import { Page } from '../components/ui/page';
import { Button } from '../components/ui/button';
import { FilePicker } from '../components/ui/file-picker';
import { SelectField, TextField } from '../components/ui/field';
import { DataTable, columnHelperFor } from '../components/ui/data-table';
import { ErrorText } from '../components/ui/notice';
import { VersionStatusTag } from '../components/ui/version-status';
import { applyServerIssues } from '../lib/form-errors';
import { useMe } from '../features/auth/api';
import { usePlates } from '../features/catalog/api';
import { useCreateTemplate, useImportTemplate, useTemplates } from '../features/templates/api';


const col = columnHelperFor<TemplateSummary>();
const columns = col.columns([
  col.accessor('name', { header: 'Template', cell: (c) => {
    const latest = c.row.original.versions.at(-1);
    return <Link className="font-semibold text-accent-700 underline" to={`/templates/${c.row.original.id}/versions/${latest?.number ?? 1}`}>{c.getValue()}</Link>;
  } }),
  col.accessor('plateCode', { header: 'Plate', cell: (c) => <span className="font-mono">{c.getValue()}</span> }),
  col.accessor('unit', { header: 'Unit' }),
  col.accessor((t) => t.versions.length, { id: 'versions', header: 'Versions', meta: { numeric: true } }),
  col.accessor((t) => t.versions.at(-1)?.status ?? '', { id: 'latest', header: 'Latest version', cell: (c) => {
    const latest = c.row.original.versions.at(-1);
    return latest ? <span className="flex items-center gap-2"><span className="num">v{latest.number}</span><VersionStatusTag status={latest.status} /></span> : '—';
  } }),
  col.accessor((t) => t.versions.filter((v) => v.state === 'released').at(-1)?.number ?? null, { id: 'released', header: 'Released', cell: (c) => (c.getValue() ? `v${c.getValue()}` : '—') }),
]);

export function TemplatesRoute() {
  const me = useMe();
  const templates = useTemplates();
  const [filter, setFilter] = useState('');
  const canEdit = may(me.data?.role, 'editTemplates');
  return (
    <Page title="Templates" subtitle="Fixture layouts on a plate, each station computed from one shared work offset.">
      <div className="max-w-sm"><TextField label="Filter templates" value={filter} onChange={(e) => setFilter(e.target.value)} /></div>
      <ErrorText error={templates.error} />
      <DataTable caption="Templates" columns={columns} data={templates.data?.items ?? NONE} filter={filter} getRowId={(t) => String(t.id)} empty="No templates yet." />
      {canEdit ? <div className="grid grid-cols-1 gap-4 lg:grid-cols-2"><NewTemplateForm /><ImportTemplate /></div> : null}
    </Page>
  );
}
const NONE: TemplateSummary[] = [];

function NewTemplateForm() {
  const plates = usePlates();
  const create = useCreateTemplate();
  const navigate = useNavigate();
  const form = useForm<CreateTemplateInput>({ resolver: zodResolver(CreateTemplateInputSchema), defaultValues: { name: '', plateId: 0 } });
  const e = form.formState.errors;
  const options = [{ value: '0', label: 'Choose a plate…' }, ...(plates.data?.items ?? []).map((p) => ({ value: String(p.id), label: `${p.code} — ${p.name}` }))];
  return (
    <form noValidate onSubmit={form.handleSubmit((v) => create.mutate(v, { onSuccess: (t) => navigate(`/templates/${t.id}/versions/1`), onError: (err) => applyServerIssues(err, form.setError) }))}
      className="flex flex-col gap-3 rounded border border-slate-300 bg-white p-4">
      <h2 className="text-lg font-semibold">New template</h2>
      <TextField label="Name" error={e.name?.message} {...form.register('name')} />
      <SelectField label="Plate" options={options} error={e.plateId?.message} {...form.register('plateId', { valueAsNumber: true })} />
      <ErrorText error={create.error} />
      <div><Button type="submit" disabled={create.isPending}>Create draft</Button></div>
    </form>
  );
}

function ImportTemplate() {
  const importer = useImportTemplate();
  const navigate = useNavigate();
  const [readError, setReadError] = useState<string | null>(null);
  const onFile = async (file: File | undefined) => {
    setReadError(null);
    if (!file) return;
    let json: unknown;
    try {
      json = JSON.parse(await file.text());
    } catch {
      setReadError(`${file.name} is not a JSON file; choose a template.json exported from Gridset.`);
      return;
    }
    importer.mutate(json, { onSuccess: (r) => navigate(`/templates/${r.id}/versions/${r.version}`) });
  };
  const issues = (importer.error as { details?: { issues?: { pointer: string; message: string }[] } } | null)?.details?.issues;
  return (
    <div className="flex flex-col gap-3 rounded border border-slate-300 bg-white p-4">
      <h2 className="text-lg font-semibold">Import a template.json</h2>
      <p className="text-slate-700">The file becomes a new template whose version 1 is a draft; its stations are recomputed.</p>
      <FilePicker label="template.json file" buttonLabel="Choose a template.json" accept="application/json,.json" onFile={(f) => void onFile(f)} />
      {readError ? <ErrorText error={readError} /> : <ErrorText error={importer.error} />}
      {issues?.length ? <ul className="list-disc pl-6 text-sm text-danger-700">{issues.slice(0, 10).map((i) => <li key={i.pointer + i.message}><span className="font-mono">{i.pointer}</span> {i.message}</li>)}</ul> : null}
    </div>
  );
}
