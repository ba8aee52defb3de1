import { useFieldArray, useForm, useWatch, type UseFormRegister, type FieldErrors } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Plus, Trash2 } from 'lucide-react';
import { COMPONENT_KINDS, ComponentInputSchema, type Component, type ComponentInput } from '../../../../shared/schemas/catalog';
import { Button } from '../../../components/ui/button';
import { SelectField, TextAreaField, TextField, inputClass } from '../../../components/ui/field';
import { ErrorText } from '../../../components/ui/notice';
import { applyServerIssues } from '../../../lib/form-errors';
import { useSaveComponent } from '../api';

const KIND_OPTIONS = COMPONENT_KINDS.map((k) => ({ value: k, label: k.replace('-', ' ') }));
const UNITS = [{ value: 'in', label: 'inches (in)' }, { value: 'mm', label: 'millimetres (mm)' }] as const;
const num = { valueAsNumber: true } as const;
const optionalNum = { setValueAs: (v: unknown) => (v === '' || v === null || v === undefined || Number.isNaN(Number(v)) ? undefined : Number(v)) };

const CLAMP_FIELDS = [
  ['acceptBelow', 'Accepts narrower by', true],
  ['acceptAbove', 'Accepts wider by', true],
  ['topHeight', 'Clamp top above deck', true],
  ['topSlope', 'Top rise per unit of width', false],
  ['gripLow', 'Grip band bottom', true],
  ['gripHigh', 'Grip band top', true],
  ['gripSlope', 'Grip rise per unit of width', false],
  ['slotSlop', 'Rail shift in its slots (±)', true],
] as const;

const emptyComponent: ComponentInput = { code: '', kind: 'center-rail', name: '', unit: 'in', dowels: [{ x: 0, y: 0 }], stops: [], jawFaces: [], clamp: null, outline: null, layer: '', notes: '', seatHeight: 0, jawTop: null };

export function ComponentForm({ component, readOnly, onSaved }: { component: Component | null; readOnly: boolean; onSaved: (c: Component) => void }) {
  const save = useSaveComponent(component?.id ?? null);
  const form = useForm<ComponentInput>({ resolver: zodResolver(ComponentInputSchema) as never, defaultValues: component ?? emptyComponent });
  const dowels = useFieldArray({ control: form.control, name: 'dowels' });
  const stops = useFieldArray({ control: form.control, name: 'stops' });
  const faces = useFieldArray({ control: form.control, name: 'jawFaces' });
  const unit = useWatch({ control: form.control, name: 'unit' });
  const hasClamp = useWatch({ control: form.control, name: 'clamp' }) !== null;
  const e = form.formState.errors;
  const submit = form.handleSubmit((values) => save.mutate(values, { onSuccess: onSaved, onError: (err) => applyServerIssues(err, form.setError) }));

  return (
    <form onSubmit={submit} noValidate className="flex max-w-5xl flex-col gap-6">
      <fieldset disabled={readOnly} className="contents">
        <section className="grid grid-cols-1 gap-4 sm:grid-cols-3">
          <TextField label="Code" error={e.code?.message} {...form.register('code')} />
          <SelectField label="Kind" options={KIND_OPTIONS} error={e.kind?.message} {...form.register('kind')} />
          <SelectField label="Unit" options={UNITS} error={e.unit?.message} {...form.register('unit')} />
          <div className="sm:col-span-2"><TextField label="Name" error={e.name?.message} {...form.register('name')} /></div>
          <TextField label="Layer" hint="DXF layer its outline is drawn on" error={e.layer?.message} {...form.register('layer')} />
          <TextField label="Seat height" unit={unit} type="number" step="any" inputMode="decimal" hint="Height of the part's seat above the plate deck: every station on it gets this Z." error={e.seatHeight?.message} {...form.register('seatHeight', { valueAsNumber: true })} />
          <TextField label="Jaw top (optional)" unit={unit} type="number" step="any" inputMode="decimal" hint="Height of the fixed jaw's or stop's top above the seat; the stock check keeps it below the cut." error={e.jawTop?.message} {...form.register('jawTop', { setValueAs: (v: unknown) => (v === '' || v === null || v === undefined ? null : Number(v)) })} />
        </section>

        <PointList
          title="Locating dowels" unit={unit} hint="Local coordinates; the first is the primary dowel at (0, 0)."
          rows={dowels.fields.length} errorOf={(i) => e.dowels?.[i]} rootError={e.dowels?.root?.message ?? e.dowels?.message}
          register={form.register} prefix="dowels" extra={[]} readOnly={readOnly}
          onAdd={() => dowels.append({ x: 0, y: 0 })} onRemove={(i) => dowels.remove(i)} minRows={1}
        />
        <PointList
          title="Stop positions" unit={unit} hint="Where a part's datum rests; angle is the station's local rotation in degrees."
          rows={stops.fields.length} errorOf={(i) => e.stops?.[i]} rootError={e.stops?.message}
          register={form.register} prefix="stops" extra={[{ key: 'angle', label: 'Angle (°)' }, { key: 'face', label: 'Jaw face (0 = first)' }]} readOnly={readOnly}
          onAdd={() => stops.append({ x: 0, y: 0, angle: 0 })} onRemove={(i) => stops.remove(i)}
        />
        <PointList
          title="Jaw faces" unit={unit} hint="A point on the face and the direction its outward normal points, in degrees from +X."
          rows={faces.fields.length} errorOf={(i) => e.jawFaces?.[i]} rootError={e.jawFaces?.message}
          register={form.register} prefix="jawFaces" extra={[{ key: 'normal', label: 'Normal (°)', required: true }]} readOnly={readOnly}
          onAdd={() => faces.append({ x: 0, y: 0, normal: 90 })} onRemove={(i) => faces.remove(i)}
        />

        <section className="flex flex-col gap-3">
          <div className="flex items-center gap-3">
            <h2 className="text-lg font-semibold">Clamp model</h2>
            {!readOnly ? (
              <Button variant="secondary" onClick={() => form.setValue('clamp', hasClamp ? null : { acceptBelow: 0, acceptAbove: 0, topHeight: 0, topSlope: 0, gripLow: 0, gripHigh: 0, gripSlope: 0, slotSlop: 0 }, { shouldDirty: true })}>
                {hasClamp ? 'Remove clamp model' : 'Add clamp model'}
              </Button>
            ) : null}
          </div>
          {hasClamp ? (
            <div className="grid grid-cols-2 gap-4 sm:grid-cols-4">
              {CLAMP_FIELDS.map(([key, label, isLength]) => (
                <TextField key={key} label={label} unit={isLength ? unit : undefined} type="number" step="any" error={e.clamp?.[key]?.message} {...form.register(`clamp.${key}`, num)} />
              ))}
            </div>
          ) : (
            <p className="text-slate-600">No clamp model: this component does not clamp stock.</p>
          )}
        </section>
        <TextAreaField label="Notes" error={e.notes?.message} {...form.register('notes')} />
      </fieldset>
      <ErrorText error={save.error} />
      {!readOnly ? <div><Button type="submit" disabled={save.isPending}>{save.isPending ? 'Saving…' : component ? 'Save component' : 'Add component'}</Button></div> : null}
    </form>
  );
}

interface PointListProps {
  title: string; hint: string; unit: string; rows: number; minRows?: number; readOnly: boolean;
  prefix: 'dowels' | 'stops' | 'jawFaces';
  extra: { key: string; label: string; required?: boolean }[];
  register: UseFormRegister<ComponentInput>;
  errorOf: (i: number) => FieldErrors<Record<string, unknown>> | undefined;
  rootError?: string;
  onAdd: () => void; onRemove: (i: number) => void;
}

/** A value's column name shown above its box on a phone, where the header row is hidden (the box keeps its own aria-label). */
function PointLabel({ text }: { text: string }) {
  return <span aria-hidden className="block text-sm text-slate-700 md:hidden">{text}</span>;
}

function PointList({ title, hint, unit, rows, minRows = 0, readOnly, prefix, extra, register, errorOf, rootError, onAdd, onRemove }: PointListProps) {
  return (
    <section className="flex flex-col gap-2">
      <div className="flex items-center gap-3">
        <h2 className="text-lg font-semibold">{title}</h2>
        {!readOnly ? <Button variant="secondary" onClick={onAdd}><Plus aria-hidden className="h-4 w-4" />Add</Button> : null}
      </div>
      <p className="text-sm text-slate-600">{hint}</p>
      {rootError ? <p role="alert" className="text-sm text-danger-700">{rootError}</p> : null}
      {rows > 0 ? (
        // On a phone each point is a card: its number and remove button on top, then its values two to a line, each with its label.
        <table className="w-fit border-collapse max-md:block max-md:w-full">
          <thead className="max-md:sr-only">
            <tr className="text-left text-sm text-slate-700">
              <th className="px-2">#</th><th className="px-2">X ({unit})</th><th className="px-2">Y ({unit})</th>
              {extra.map((x) => <th key={x.key} className="px-2">{x.label}</th>)}<th />
            </tr>
          </thead>
          <tbody className="max-md:block">
            {Array.from({ length: rows }, (_, i) => {
              const err = errorOf(i);
              const messages = [err?.x?.message, err?.y?.message, ...extra.map((x) => err?.[x.key]?.message), err?.message].filter(Boolean);
              return (
                <tr key={i} className="max-md:grid max-md:grid-cols-2 max-md:gap-x-3 max-md:gap-y-1 max-md:border-b max-md:border-slate-200 max-md:py-2">
                  <td className="px-2 text-slate-600 max-md:order-[-1] max-md:self-center max-md:px-0 max-md:font-semibold">{i + 1}</td>
                  <td className="px-1 max-md:px-0"><PointLabel text={`X (${unit})`} /><input aria-label={`${title} ${i + 1} X`} type="number" step="any" className={`${inputClass} num w-32 max-md:w-full`} {...register(`${prefix}.${i}.x` as never, num)} /></td>
                  <td className="px-1 max-md:px-0"><PointLabel text={`Y (${unit})`} /><input aria-label={`${title} ${i + 1} Y`} type="number" step="any" className={`${inputClass} num w-32 max-md:w-full`} {...register(`${prefix}.${i}.y` as never, num)} /></td>
                  {extra.map((x) => (
                    <td key={x.key} className="px-1 max-md:px-0">
                      <PointLabel text={x.label} />
                      <input aria-label={`${title} ${i + 1} ${x.label}`} type="number" step="any" className={`${inputClass} num w-28 max-md:w-full`} {...register(`${prefix}.${i}.${x.key}` as never, x.required ? num : optionalNum)} />
                    </td>
                  ))}
                  <td className="px-1 max-md:order-[-1] max-md:justify-self-end max-md:px-0">
                    {!readOnly && rows > minRows ? <Button variant="ghost" aria-label={`Remove ${title.toLowerCase()} ${i + 1}`} onClick={() => onRemove(i)}><Trash2 aria-hidden className="h-4 w-4" /></Button> : null}
                  </td>
                  {messages.length ? <td className="px-2 text-sm text-danger-700 max-md:col-span-2 max-md:px-0" role="alert">{String(messages[0])}</td> : null}
                </tr>
              );
            })}
          </tbody>
        </table>
      ) : null}
    </section>
  );
}
