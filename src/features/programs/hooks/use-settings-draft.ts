import { useEffect, useState } from 'react';
import { toast } from 'sonner';
import type { RevisionDetail, RevisionSettingsInput } from '../../../../shared/schemas/program.schema';
import { ApiError } from '../../../lib/api-client';
import { useSaveSettings } from '../api/programs';

/**
 * A working copy of the revision's settings. Saving sends the version the editor started from;
 * a 409 keeps the draft so nothing typed is lost, and says to reload.
 */
export function useSettingsDraft(r: RevisionDetail) {
  const [draft, setDraft] = useState<RevisionSettingsInput>(r.settings);
  const [base, setBase] = useState(r.version);
  const save = useSaveSettings(r.id);
  const dirty = JSON.stringify(draft) !== JSON.stringify(r.settings);
  useEffect(() => {
    // Another save (or a reload) brought a newer revision: follow it when nothing is pending here.
    if (r.version !== base && !dirty) {
      setDraft(r.settings);
      setBase(r.version);
    }
  }, [r.version, r.settings, base, dirty]);
  const errors = save.error instanceof ApiError ? save.error.problem.errors : [];
  const fieldError = (path: string) => errors.find((e) => e.path === `settings.${path}` || e.path === path)?.message;
  return {
    draft,
    setDraft,
    dirty,
    saving: save.isPending,
    error: save.error,
    fieldError,
    reset: () => setDraft(r.settings),
    save: (next: RevisionSettingsInput = draft) =>
      save.mutate(
        { settings: next, version: r.version },
        {
          onSuccess: () => {
            setBase(r.version + 1);
            toast.success('Saved.');
          },
          onError: (e) => toast.error(e.message),
        },
      ),
  };
}

/** Parses a number typed by a person (decimal point or comma); NaN when it is not one. */
export function parseNum(s: string): number {
  const t = s.trim().replace(',', '.');
  return t === '' ? NaN : Number(t);
}
