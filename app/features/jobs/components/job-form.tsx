import { useEffect, useMemo, useRef } from 'react';
import { useForm, useWatch, type UseFormSetError } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { JobInputSchema, type JobFields, type JobInput } from '../../../../shared/schemas/job';
import { PART_ROTATIONS } from '../../../../shared/jobs/job-problems';
import type { TemplateSummary } from '../../../../shared/schemas/template-api';
import { Button } from '../../../components/ui/button';
import { SelectField, TextAreaField, TextField } from '../../../components/ui/field';
import { ErrorText } from '../../../components/ui/notice';
import { parseDecimal } from '../../../../shared/units/decimal';

const ROTATION_OPTIONS = PART_ROTATIONS.map((r) => ({ value: String(r), label: r === 0 ? '0° (as drawn)' : `${r}° counter-clockwise` }));
const released = (t: TemplateSummary) => t.versions.filter((v) => v.state === 'released');
/** Numbers are typed as text (no spinner to nudge with a glove) and read as numbers; empty reads as missing. */
const decimal = { type: 'text', inputMode: 'decimal', autoComplete: 'off', spellCheck: false, className: 'num' } as const;

export interface JobFormProps {
  /** Templates to choose from; only their released versions can be pinned. */
  templates: readonly TemplateSummary[];
  defaultValues?: JobInput;
  title: string;
  submitLabel: string;
  pending: boolean;
  error: unknown;
  onSubmit: (values: JobFields, setError: UseFormSetError<JobInput>) => void;
  onCancel?: () => void;
}

/**
 * A job's own fields, checked by JobInputSchema (the route's own schema) as the user types and
 * again on the server; lengths are in the chosen template's unit.
 */
export function JobForm({ templates, defaultValues, title, submitLabel, pending, error, onSubmit, onCancel }: JobFormProps) {
  const form = useForm<JobInput, unknown, JobFields>({
    resolver: zodResolver(JobInputSchema),
    defaultValues: defaultValues ?? { name: '', partNumber: '', partRevision: '', templateId: 0, version: 0, stock: { material: '' }, loadMinutes: 0, partRotation: 0, notes: '' } as JobInput,
  });
  const e = form.formState.errors;
  const templateId = Number(useWatch({ control: form.control, name: 'templateId' })) || 0;
  const template = templates.find((t) => t.id === templateId) ?? null;
  const versions = useMemo(() => (template ? released(template) : []), [template]);
  const unit = template?.unit;

  // A newly chosen template starts on its latest release; the version stays when it is still listed.
  const lastTemplate = useRef(templateId);
  useEffect(() => {
    if (lastTemplate.current === templateId) return;
    lastTemplate.current = templateId;
    const current = Number(form.getValues('version'));
    if (!versions.some((v) => v.number === current)) form.setValue('version', versions.at(-1)?.number ?? 0, { shouldValidate: form.formState.isSubmitted });
  }, [templateId, versions, form]);

  const templateOptions = [
    { value: '0', label: 'Choose a template…' },
    ...templates.filter((t) => released(t).length > 0).map((t) => ({ value: String(t.id), label: `${t.name} (${t.plateCode}, ${t.unit})` })),
  ];
  const versionOptions = versions.length
    ? versions.map((v) => ({ value: String(v.number), label: `v${v.number} · released · ${v.contentHash.slice(0, 8)}` })).reverse()
    : [{ value: '0', label: template ? 'No released version' : 'Choose a template first' }];

  // Typed numbers are read with the one decimal grammar (shared/units/decimal.ts); anything else is NaN, which the schema refuses.
  const num = (name: Parameters<typeof form.register>[0]) => form.register(name, { setValueAs: (v: unknown) => (typeof v === 'number' ? v : parseDecimal(String(v ?? '')) ?? Number.NaN) });
  return (
    <form noValidate aria-label={title} className="flex flex-col gap-4 rounded border border-slate-300 bg-white p-4"
      onSubmit={form.handleSubmit((v) => onSubmit(v, form.setError))}>
      <h2 className="text-lg font-semibold">{title}</h2>
      <fieldset className="grid grid-cols-1 gap-3 sm:grid-cols-3">
        <legend className="mb-1 font-semibold text-slate-800">Job and part</legend>
        <TextField label="Job name" error={e.name?.message} {...form.register('name')} />
        <TextField label="Part number" className="font-mono" error={e.partNumber?.message} {...form.register('partNumber')} />
        <TextField label="Revision" className="font-mono" error={e.partRevision?.message} hint="optional" {...form.register('partRevision')} />
      </fieldset>
      <fieldset className="grid grid-cols-1 gap-3 sm:grid-cols-2">
        <legend className="mb-1 font-semibold text-slate-800">Template</legend>
        <SelectField label="Template" options={templateOptions} error={e.templateId?.message} {...form.register('templateId', { valueAsNumber: true })} />
        <SelectField label="Released version" options={versionOptions} error={e.version?.message}
          hint="The job is pinned to this version; a later release does not change it." {...form.register('version', { valueAsNumber: true })} />
      </fieldset>
      <fieldset className="grid grid-cols-1 gap-3 sm:grid-cols-4">
        <legend className="mb-1 font-semibold text-slate-800">Stock bar {unit ? <span className="font-normal text-slate-600">— nominal sizes in {unit}</span> : null}</legend>
        <TextField label="Width" unit={unit} error={e.stock?.width?.message} {...decimal} {...num('stock.width')} />
        <TextField label="Thickness" unit={unit} error={e.stock?.thickness?.message} {...decimal} {...num('stock.thickness')} />
        <TextField label="Length" unit={unit} error={e.stock?.length?.message} {...decimal} {...num('stock.length')} />
        <TextField label="Material" error={e.stock?.material?.message} hint="e.g. 6061-T6" {...form.register('stock.material')} />
      </fieldset>
      <fieldset className="grid grid-cols-1 gap-3 sm:grid-cols-3">
        <legend className="mb-1 font-semibold text-slate-800">Part outline</legend>
        <SelectField label="Part rotation" options={ROTATION_OPTIONS} error={e.partRotation?.message}
          hint="turns the part outline about its datum at every station" {...form.register('partRotation', { valueAsNumber: true })} />
      </fieldset>
      <fieldset className="grid grid-cols-1 gap-3 sm:grid-cols-3">
        <legend className="mb-1 font-semibold text-slate-800">Clamping</legend>
        <TextField label="Carrier thickness" unit={unit} error={e.carrier?.message} hint="stock left under the part, where the clamp grips" {...decimal} {...num('carrier')} />
        <TextField label="Tool clearance" unit={unit} error={e.clearance?.message} hint="kept between the tool and the clamp tops" {...decimal} {...num('clearance')} />
        <TextField label="Minimum bite" unit={unit} error={e.minBite?.message} hint="least flat face the clamp must grip" {...decimal} {...num('minBite')} />
      </fieldset>
      <fieldset className="grid grid-cols-1 gap-3 sm:grid-cols-3">
        <legend className="mb-1 font-semibold text-slate-800">Times</legend>
        <TextField label="Cycle time per station" unit="min" error={e.cycleMinutes?.message} {...decimal} {...num('cycleMinutes')} />
        <TextField label="Load time" unit="min" error={e.loadMinutes?.message} hint="to load the whole fixture" {...decimal} {...num('loadMinutes')} />
      </fieldset>
      <TextAreaField label="Notes" error={e.notes?.message} hint="optional; kept with the job" {...form.register('notes')} />
      <ErrorText error={error} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" disabled={pending}>{pending ? 'Saving…' : submitLabel}</Button>
        {onCancel ? <Button variant="secondary" onClick={onCancel}>Cancel</Button> : null}
      </div>
    </form>
  );
}
