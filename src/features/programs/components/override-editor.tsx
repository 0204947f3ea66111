import { useState } from 'react';
import type { Override } from '../../../../shared/schemas/program.schema';
import { Button } from '../../../components/ui/button';
import { SelectField, TextField } from '../../../components/ui/field';
import { useLibraryFile } from '../api/library-refs';

export interface OverrideEditorProps {
  refName: string;
  current?: Override;
  onSave: (o: Override) => void;
  onClear: () => void;
  /** closes the form without saving */
  onCancel: () => void;
  saving: boolean;
}

/** A part's override (package, nozzle, vision preset) with its reason; it applies on every board. */
export function OverrideEditor({ refName, current, onSave, onClear, onCancel, saving }: OverrideEditorProps) {
  const lib = useLibraryFile();
  const [o, setO] = useState<Override>(current ?? { reason: '' });
  const reasonOk = o.reason.trim().length >= 3;
  return (
    <section
      aria-label={`Override ${refName}`}
      className="rounded border border-copper-300 bg-white p-4"
      onKeyDown={(e) => {
        if (e.key === 'Escape' && !saving) {
          e.stopPropagation();
          onCancel();
        }
      }}
    >
      <h3 className="mb-2 font-semibold">
        Override <span className="num">{refName}</span> (every board)
      </h3>
      <div className="grid grid-cols-3 gap-3">
        <SelectField label="Package" value={o.package ?? ''} onChange={(e) => setO({ ...o, package: e.target.value || undefined })}>
          <option value="">(as matched)</option>
          {lib.data?.packages.map((p) => (
            <option key={p.name} value={p.name}>
              {p.name}
            </option>
          ))}
        </SelectField>
        <SelectField label="Nozzle" value={o.nozzle ?? ''} onChange={(e) => setO({ ...o, nozzle: e.target.value || undefined })}>
          <option value="">(as chosen)</option>
          {lib.data?.nozzles.map((n) => (
            <option key={n.name} value={n.name}>
              {n.name} — tip {n.tipOuter} mm
            </option>
          ))}
        </SelectField>
        <SelectField label="Vision preset" value={o.vision ?? ''} onChange={(e) => setO({ ...o, vision: e.target.value || undefined })}>
          <option value="">(the package's)</option>
          {lib.data?.visionPresets.map((v) => (
            <option key={v.name} value={v.name}>
              {v.name}
            </option>
          ))}
        </SelectField>
        <TextField className="col-span-3" label="Reason (kept with the revision)" value={o.reason} onChange={(e) => setO({ ...o, reason: e.target.value })} error={o.reason && !reasonOk ? 'At least 3 characters' : undefined} />
      </div>
      <div className="mt-3 flex gap-2">
        <Button disabled={!reasonOk || saving || (!o.package && !o.nozzle && !o.vision)} onClick={() => onSave({ ...o, reason: o.reason.trim() })}>
          Save override
        </Button>
        {current && (
          <Button variant="secondary" disabled={saving} onClick={onClear}>
            Remove override
          </Button>
        )}
        <Button variant="ghost" disabled={saving} onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </section>
  );
}
