import type { UseFormReturn } from 'react-hook-form';
import type { ClampModel, Component } from '../../../../shared/schemas/catalog';
import type { Unit } from '../../../../shared/schemas/common';
import { formatLength } from '../../../../shared/units/units';
import { SelectField, TextField } from '../../../components/ui/field';
import { SETUP_LABEL, formMessage, type SetupFormText, type SetupFormValues, type SetupLengthField } from '../setup-form';

type SetupForm = UseFormReturn<SetupFormText, unknown, SetupFormValues>;

const HINT: Partial<Record<SetupLengthField, string>> = {
  nominalOpening: 'the width this rail holds at its nominal setting: no template gives it here, so check it',
  carrier: 'left at the bottom of the part',
  clearance: 'kept between the clamp tops and the tool',
  minBite: 'the least flat face the clamp must grip',
};

/** Text fields for numbers: no spinner or wheel that changes a value under a gloved hand. */
export function LengthField({ form, field, unit, hint }: { form: SetupForm; field: SetupLengthField; unit: Unit | null; hint?: string }) {
  return (
    <TextField
      label={SETUP_LABEL[field]}
      unit={unit ?? undefined}
      hint={hint ?? HINT[field]}
      inputMode="decimal"
      autoComplete="off"
      spellCheck={false}
      className="num max-sm:min-h-11"
      error={formMessage(field, form.formState.errors[field]?.message)}
      {...form.register(field)}
    />
  );
}

const CLAMP_FIELDS: readonly (readonly [keyof ClampModel, string, 'length' | 'slope'])[] = [
  ['acceptBelow', 'Accepts narrower by', 'length'],
  ['acceptAbove', 'Accepts wider by', 'length'],
  ['topHeight', 'Clamp top above deck', 'length'],
  ['topSlope', 'Top rise per unit of width', 'slope'],
  ['gripLow', 'Grip band bottom', 'length'],
  ['gripHigh', 'Grip band top', 'length'],
  ['gripSlope', 'Grip rise per unit of width', 'slope'],
  ['slotSlop', 'Rail shift in its slots (±)', 'length'],
];

/** The chosen rail's clamp model, read only: what the verdicts are worked out from. */
export function ClampReference({ rail }: { rail: Component & { clamp: ClampModel } }) {
  return (
    <section aria-labelledby="clamp-model-title" className="rounded border border-slate-300 bg-slate-50 p-3">
      <h3 id="clamp-model-title" className="font-semibold">
        Clamp model of <span className="font-mono">{rail.code}</span> <span className="font-normal text-slate-600">— from the catalog, read only</span>
      </h3>
      <dl className="mt-1 grid grid-cols-1">
        {CLAMP_FIELDS.map(([key, label, kind]) => (
          <div key={key} className="flex items-baseline justify-between gap-2 border-b border-slate-200 py-0.5 last:border-0">
            <dt className="text-slate-700">{label}</dt>
            <dd className="num">{kind === 'length' ? formatLength(rail.clamp[key], rail.unit) : rail.clamp[key].toFixed(3)}</dd>
          </div>
        ))}
      </dl>
    </section>
  );
}

export function SetupFields({ form, rails, rail, onRailChange }: {
  form: SetupForm;
  rails: readonly Component[];
  rail: (Component & { clamp: ClampModel }) | null;
  onRailChange: (id: string) => void;
}) {
  const unit = rail?.unit ?? null;
  const options = [
    { value: '', label: 'Choose a jaw rail…' },
    ...rails.map((r) => ({ value: String(r.id), label: `${r.code} — ${r.name} (${r.unit})` })),
  ];
  const e = form.formState.errors;
  return (
    <section aria-labelledby="setup-title" className="flex flex-col gap-4 rounded border border-slate-300 bg-white p-4">
      <h2 id="setup-title" className="text-lg font-semibold">1 · Rail and job</h2>
      <SelectField
        label="Jaw rail"
        options={options}
        className="max-sm:min-h-11"
        error={e.railId?.message}
        hint={rail ? `Unit: ${rail.unit === 'in' ? 'inches' : 'millimetres'} (${rail.unit}), the rail's — every number on this screen uses it.` : 'Rails in the catalog that carry a clamp model; the rail sets the unit.'}
        {...form.register('railId', { onChange: (ev: { target: { value: string } }) => onRailChange(ev.target.value) })}
      />
      {rail ? <ClampReference rail={rail} /> : null}
      <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
        <LengthField form={form} field="nominalOpening" unit={unit} />
        <LengthField form={form} field="carrier" unit={unit} />
        <LengthField form={form} field="clearance" unit={unit} />
        <LengthField form={form} field="minBite" unit={unit} />
        <LengthField form={form} field="settingAccuracy" unit={unit} hint={`how closely the operator sets a rail; empty for ${unit === 'mm' ? '0.050 mm' : '0.0020 in'}`} />
      </div>
    </section>
  );
}
