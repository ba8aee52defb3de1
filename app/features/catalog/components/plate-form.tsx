import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { PlateInputSchema, type Plate, type PlateInput } from '../../../../shared/schemas/catalog';
import { Button } from '../../../components/ui/button';
import { SelectField, TextAreaField, TextField } from '../../../components/ui/field';
import { ErrorText } from '../../../components/ui/notice';
import { applyServerIssues } from '../../../lib/form-errors';
import { useSavePlate } from '../api';

const UNITS = [{ value: 'in', label: 'inches (in)' }, { value: 'mm', label: 'millimetres (mm)' }] as const;

export function PlateForm({ plate, readOnly, onSaved }: { plate: Plate | null; readOnly: boolean; onSaved: (p: Plate) => void }) {
  const save = useSavePlate(plate?.id ?? null);
  const form = useForm<PlateInput>({
    resolver: zodResolver(PlateInputSchema) as never,
    defaultValues: plate ?? { code: '', name: '', unit: 'in', pitch: 2, columns: 12, rows: 8, holeDiameter: 0.5, thread: '', notes: '' },
  });
  const unit = useWatch({ control: form.control, name: 'unit' });
  const e = form.formState.errors;
  const submit = form.handleSubmit((values) =>
    save.mutate(values, { onSuccess: (p) => onSaved(p), onError: (err) => applyServerIssues(err, form.setError) }),
  );
  const num = { valueAsNumber: true } as const;
  return (
    <form onSubmit={submit} noValidate className="grid max-w-3xl grid-cols-1 gap-4 sm:grid-cols-2">
      <fieldset disabled={readOnly} className="contents">
        <TextField label="Code" error={e.code?.message} {...form.register('code')} />
        <TextField label="Name" error={e.name?.message} {...form.register('name')} />
        <SelectField label="Unit" options={UNITS} error={e.unit?.message} {...form.register('unit')} />
        <TextField label="Grid pitch" unit={unit} type="number" step="any" error={e.pitch?.message} {...form.register('pitch', num)} />
        <TextField label="Columns of holes" type="number" step="1" error={e.columns?.message} {...form.register('columns', num)} />
        <TextField label="Rows of holes" type="number" step="1" error={e.rows?.message} {...form.register('rows', num)} />
        <TextField label="Hole diameter" unit={unit} type="number" step="any" error={e.holeDiameter?.message} {...form.register('holeDiameter', num)} />
        <TextField label="Thread" hint="e.g. 1/2-13 or M12" error={e.thread?.message} {...form.register('thread')} />
        <TextField label="Edge margin" unit={unit} type="number" step="any" hint="Outer hole centers to the plate edge; half a pitch when empty." error={e.edgeMargin?.message}
          {...form.register('edgeMargin', { setValueAs: (v) => (v === '' || v === null || Number.isNaN(Number(v)) ? undefined : Number(v)) })} />
        <div className="sm:col-span-2"><TextAreaField label="Notes" error={e.notes?.message} {...form.register('notes')} /></div>
      </fieldset>
      <div className="sm:col-span-2 flex flex-col gap-2">
        <ErrorText error={save.error} />
        {!readOnly ? <div><Button type="submit" disabled={save.isPending}>{save.isPending ? 'Saving…' : plate ? 'Save plate' : 'Add plate'}</Button></div> : null}
      </div>
    </form>
  );
}
