import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { ShopSettingsSchema, type ShopSettings } from '../../../../shared/schemas/settings';
import { Button } from '../../../components/ui/button';
import { SelectField, TextField } from '../../../components/ui/field';
import { ErrorText, Notice } from '../../../components/ui/notice';
import { useSaveShopSettings } from '../api';

const UNITS = [{ value: 'in', label: 'inches (in)' }, { value: 'mm', label: 'millimetres (mm)' }] as const;

export function SettingsForm({ settings, readOnly }: { settings: ShopSettings; readOnly: boolean }) {
  const save = useSaveShopSettings();
  const form = useForm<ShopSettings>({ resolver: zodResolver(ShopSettingsSchema), defaultValues: settings });
  const e = form.formState.errors;
  const num = { valueAsNumber: true } as const;
  return (
    <form onSubmit={form.handleSubmit((v) => save.mutate(v))} noValidate className="grid max-w-3xl grid-cols-1 gap-4 sm:grid-cols-2">
      <fieldset disabled={readOnly} className="contents">
        <TextField label="Shop name" error={e.shopName?.message} {...form.register('shopName')} />
        <SelectField label="Default unit" options={UNITS} error={e.defaultUnit?.message} {...form.register('defaultUnit')} />
        <TextField label="Station probe-check tolerance" unit="in" type="number" step="any" error={e.probeToleranceIn?.message} {...form.register('probeToleranceIn', num)} />
        <TextField label="Station probe-check tolerance" unit="mm" type="number" step="any" error={e.probeToleranceMm?.message} {...form.register('probeToleranceMm', num)} />
        <TextField label="Extended work offsets on the control (G54.1 P1 to Pn, 1 to 300)" type="number" step="1" error={e.extOffsetRegisters?.message} {...form.register('extOffsetRegisters', num)} />
      </fieldset>
      <div className="sm:col-span-2 flex flex-col gap-2">
        <ErrorText error={save.error} />
        {save.isSuccess ? <Notice tone="info" title="Shop settings saved." /> : null}
        {!readOnly ? <div><Button type="submit" disabled={save.isPending}>Save settings</Button></div> : null}
      </div>
    </form>
  );
}
