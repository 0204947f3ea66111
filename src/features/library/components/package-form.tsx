import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useState, type ReactNode } from 'react';
import { Controller, useForm, useWatch } from 'react-hook-form';
import {
  createPackageInputSchema,
  DEFAULT_COURTYARD_MM,
  FEEDER_KINDS,
  PACKAGE_FAMILIES,
  packageWarnings,
  TAPE_WIDTHS,
  type CreatePackageInput,
  type NozzleDto,
  type VisionPresetDto,
} from '../../../../shared/schemas/library.schema';
import { Button } from '../../../components/ui/button';
import { SelectField, TextField } from '../../../components/ui/field';
import { ApiError } from '../../../lib/api-client';
import { PackageDrawing } from './package-drawing';
import { fixed } from '../../../lib/format';

const num = { valueAsNumber: true } as const;
const optNum = { setValueAs: (v: unknown) => (v === '' || v == null ? null : typeof v === 'number' ? v : Number(v)) };

export interface PackageFormProps {
  /** Accessible name of the form. */
  label: string;
  initial: CreatePackageInput;
  nozzles: NozzleDto[];
  presets: VisionPresetDto[];
  /** Show the aliases field (new packages). */
  withAliases?: boolean;
  readOnly?: boolean;
  submitLabel: string;
  /** Resolves when saved; an ApiError puts the server's messages beside the fields. */
  onSubmit?: (values: CreatePackageInput) => Promise<unknown>;
  /** Offered when the server says someone else saved first: loads their version into the form. */
  onReload?: () => void;
  actions?: ReactNode;
  children?: ReactNode;
}

/** Splits "A, B C" into ["A", "B", "C"]. */
export const splitList = (s: string) => s.split(/[\s,;|]+/).map((x) => x.trim()).filter(Boolean);

function NozzleList({ value, onChange, nozzles, disabled, error }: { value: string[]; onChange: (v: string[]) => void; nozzles: NozzleDto[]; disabled?: boolean; error?: string }) {
  const [pick, setPick] = useState('');
  const left = nozzles.filter((n) => !value.includes(n.name));
  const move = (i: number) => {
    const v = [...value];
    [v[i - 1], v[i]] = [v[i], v[i - 1]];
    onChange(v);
  };
  return (
    <fieldset className="flex flex-col gap-1" aria-label="Nozzles">
      <legend className="text-xs font-medium text-ink-700">Nozzles, preferred first</legend>
      <ol className="flex flex-wrap gap-1.5">
        {value.length === 0 && <li className="text-xs text-ink-500">None listed: the largest tip that fits the body is chosen.</li>}
        {value.map((n, i) => {
          const nz = nozzles.find((x) => x.name === n);
          return (
            <li key={n} className="flex items-center gap-1 rounded border border-ink-300 bg-ink-50 px-1.5 py-0.5 text-xs">
              <span className="num text-ink-500">{i + 1}.</span>
              <span className="font-medium">{n}</span>
              {nz && <span className="num text-ink-500">⌀ {fixed(nz.tipOuter)} mm</span>}
              {!disabled && i > 0 && <button type="button" aria-label={`Prefer ${n}`} className="px-0.5 text-ink-500 hover:text-ink-900" onClick={() => move(i)}>↑</button>}
              {!disabled && <button type="button" aria-label={`Remove ${n}`} className="px-0.5 text-ink-500 hover:text-sev-error" onClick={() => onChange(value.filter((x) => x !== n))}>×</button>}
            </li>
          );
        })}
      </ol>
      {!disabled && left.length > 0 && (
        <div className="flex items-center gap-1">
          <select aria-label="Add a nozzle" value={pick} onChange={(e) => setPick(e.target.value)} className="rounded border border-ink-300 bg-white px-2 py-1 text-sm">
            <option value="">Add a nozzle…</option>
            {left.map((n) => <option key={n.id} value={n.name}>{n.name} (⌀ {fixed(n.tipOuter)} mm)</option>)}
          </select>
          <Button variant="secondary" disabled={!pick} onClick={() => { onChange([...value, pick]); setPick(''); }}>Add</Button>
        </div>
      )}
      {error && <p role="alert" className="text-xs text-sev-error">{error}</p>}
    </fieldset>
  );
}

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <fieldset className="grid grid-cols-2 gap-3 rounded border border-ink-200 bg-white p-3 @xl:grid-cols-3">
      <legend className="px-1 text-xs font-semibold uppercase tracking-wide text-ink-500">{title}</legend>
      {children}
    </fieldset>
  );
}

/**
 * The package editor: react-hook-form over the shared zod schema, units beside the inputs, the
 * server's errors beside their fields, and the live drawing of what the numbers mean.
 */
export function PackageForm({ label, initial, nozzles, presets, withAliases, readOnly, submitLabel, onSubmit, onReload, actions, children }: PackageFormProps) {
  const form = useForm<CreatePackageInput>({ resolver: zodResolver(createPackageInputSchema), defaultValues: initial, mode: 'onChange' });
  const [aliasText, setAliasText] = useState(initial.aliases.join(', '));
  const [banner, setBanner] = useState<{ conflict: boolean; text: string } | null>(null);
  const [saving, setSaving] = useState(false);
  useEffect(() => {
    form.reset(initial);
    setAliasText(initial.aliases.join(', '));
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [JSON.stringify(initial)]);
  const v = useWatch({ control: form.control }) as CreatePackageInput;
  const e = form.formState.errors;
  const warnings = packageWarnings({ bodyLength: Number(v.bodyLength), bodyWidth: Number(v.bodyWidth), nozzles: v.nozzles ?? [] }, nozzles);

  const submit = form.handleSubmit(async (values) => {
    if (!onSubmit) return;
    setBanner(null);
    setSaving(true);
    try {
      await onSubmit({ ...values, aliases: withAliases ? splitList(aliasText) : values.aliases });
    } catch (err) {
      if (err instanceof ApiError) {
        for (const x of err.problem.errors) {
          const path = x.path.startsWith('aliases') ? 'aliases' : x.path.replace(/\.\d+$/, '');
          form.setError(path as keyof CreatePackageInput, { message: x.message });
        }
        setBanner({ conflict: err.status === 409 && /someone else/.test(err.message), text: err.message });
      } else setBanner({ conflict: false, text: (err as Error).message });
    } finally {
      setSaving(false);
    }
  });

  const field = (name: keyof CreatePackageInput) => e[name]?.message as string | undefined;
  const ro = readOnly ? { readOnly: true, disabled: true } : {};

  return (
    <div className="@container">
    <div className="grid grid-cols-1 gap-5 @5xl:grid-cols-[minmax(0,1fr)_440px]">
      <form aria-label={label} noValidate onSubmit={submit} className="flex flex-col gap-4">
        {banner && (
          <div role="alert" className={`rounded border px-4 py-3 text-sm ${banner.conflict ? 'border-copper-400 bg-copper-50 text-copper-800' : 'border-sev-error/40 bg-sev-error/5 text-sev-error'}`}>
            <p>{banner.text}</p>
            {banner.conflict && onReload && (
              <Button variant="secondary" className="mt-2" onClick={() => { setBanner(null); onReload(); }}>
                Load their version (your edits here are discarded)
              </Button>
            )}
          </div>
        )}
        <Section title="Identity">
          <TextField label="Name" autoComplete="off" error={field('name')} {...form.register('name')} {...ro} />
          <SelectField label="Family" error={field('family')} {...form.register('family')} disabled={readOnly}>
            {PACKAGE_FAMILIES.map((f) => <option key={f} value={f}>{f}</option>)}
          </SelectField>
          {withAliases && (
            <TextField
              label="Aliases"
              value={aliasText}
              onChange={(ev) => setAliasText(ev.target.value)}
              hint="Footprint names or patterns with * and ?, separated by commas."
              error={field('aliases')}
              autoComplete="off"
              {...ro}
            />
          )}
        </Section>
        <Section title="Body (zero orientation: length along X)">
          <TextField label="Length" unit="mm" type="number" step="any" error={field('bodyLength')} {...form.register('bodyLength', num)} {...ro} />
          <TextField label="Width" unit="mm" type="number" step="any" error={field('bodyWidth')} {...form.register('bodyWidth', num)} {...ro} />
          <TextField label="Height" unit="mm" type="number" step="any" error={field('bodyHeight')} {...form.register('bodyHeight', num)} {...ro} />
          <TextField label="Body offset X" unit="mm" type="number" step="any" hint="From the footprint origin to the body centre." error={field('offsetX')} {...form.register('offsetX', num)} {...ro} />
          <TextField label="Body offset Y" unit="mm" type="number" step="any" error={field('offsetY')} {...form.register('offsetY', num)} {...ro} />
          <TextField label="Courtyard excess" unit="mm" type="number" step="any" hint={`IPC-7351B level B: ${DEFAULT_COURTYARD_MM.toFixed(2)} mm`} error={field('courtyard')} {...form.register('courtyard', num)} {...ro} />
          <TextField label="Rotation offset" unit="°" type="number" step="any" hint="Added to every placement of this package." error={field('rotationOffset')} {...form.register('rotationOffset', num)} {...ro} />
          <label className="flex items-center gap-2 self-end pb-2 text-sm">
            <input type="checkbox" {...form.register('polarised')} disabled={readOnly} /> Polarised
          </label>
          <label className="flex items-center gap-2 self-end pb-2 text-sm">
            <input type="checkbox" {...form.register('overhang')} disabled={readOnly} /> May overhang the board edge
          </label>
        </Section>
        <Section title="Pick-up and vision">
          <div className="col-span-2 @xl:col-span-3">
            <Controller control={form.control} name="nozzles" render={({ field: f }) => <NozzleList value={f.value} onChange={f.onChange} nozzles={nozzles} disabled={readOnly} error={field('nozzles')} />} />
          </div>
          <SelectField
            label="Vision preset"
            error={field('vision')}
            disabled={readOnly}
            value={v.vision ?? ''}
            onChange={(ev) => form.setValue('vision', ev.target.value || null, { shouldValidate: true, shouldDirty: true })}
          >
            <option value="">(none)</option>
            {presets.map((p) => <option key={p.id} value={p.name}>{p.name}</option>)}
          </SelectField>
        </Section>
        <Section title="Feeding">
          <SelectField label="Feeder" error={field('feeder')} {...form.register('feeder')} disabled={readOnly}>
            {FEEDER_KINDS.map((f) => <option key={f} value={f}>{f}</option>)}
          </SelectField>
          <SelectField
            label="Tape width (mm)"
            error={field('tapeWidth')}
            disabled={readOnly}
            value={v.tapeWidth == null ? '' : String(v.tapeWidth)}
            onChange={(ev) => form.setValue('tapeWidth', ev.target.value === '' ? null : Number(ev.target.value), { shouldValidate: true, shouldDirty: true })}
          >
            <option value="">(no tape)</option>
            {TAPE_WIDTHS.map((w) => <option key={w} value={w}>{w} mm</option>)}
          </SelectField>
          <TextField label="Pocket pitch" unit="mm" type="number" step="any" hint="2 mm (8 mm tape only) or a multiple of 4 mm" error={field('tapePitch')} {...form.register('tapePitch', optNum)} {...ro} />
          <TextField label="Pad length" unit="mm" type="number" step="any" error={field('padLength')} {...form.register('padLength', optNum)} {...ro} />
          <TextField label="Pad width" unit="mm" type="number" step="any" error={field('padWidth')} {...form.register('padWidth', optNum)} {...ro} />
          <TextField label="Pad count" type="number" step="1" error={field('padCount')} {...form.register('padCount', optNum)} {...ro} />
        </Section>
        <div className="flex flex-col gap-1">
          <label htmlFor="pkg-notes" className="text-xs font-medium text-ink-700">Notes and sources</label>
          <textarea id="pkg-notes" rows={3} className="rounded border border-ink-300 bg-white px-2 py-1.5 text-sm" {...form.register('notes')} readOnly={readOnly} />
          {field('notes') && <p role="alert" className="text-xs text-sev-error">{field('notes')}</p>}
        </div>
        {children}
        <div className="flex flex-wrap items-center gap-2">
          {!readOnly && onSubmit && (
            <Button type="submit" disabled={saving}>{saving ? 'Saving…' : submitLabel}</Button>
          )}
          {actions}
        </div>
      </form>
      <aside className="order-first flex flex-col gap-3 @5xl:sticky @5xl:top-4 @5xl:order-none @5xl:self-start">
        <PackageDrawing values={{ ...v, bodyLength: Number(v.bodyLength), bodyWidth: Number(v.bodyWidth), bodyHeight: Number(v.bodyHeight), offsetX: Number(v.offsetX), offsetY: Number(v.offsetY), courtyard: Number(v.courtyard), rotationOffset: Number(v.rotationOffset), polarised: !!v.polarised, family: v.family ?? 'other' }} />
        {warnings.length > 0 && (
          <ul aria-label="Warnings" className="flex flex-col gap-1 rounded border border-sev-warning/60 bg-sev-warning/10 px-3 py-2 text-xs text-copper-800">
            {warnings.map((w) => <li key={w.path}>⚠ {w.message}</li>)}
          </ul>
        )}
      </aside>
    </div>
    </div>
  );
}
