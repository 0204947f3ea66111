// The review state table (server/modules/programs/review-state.ts): which step is allowed from
// which state, and the words of each refusal (the same the API answered before the table).
import { describe, expect, it } from 'vitest';
import type { RevisionState } from '../../server/db/entities/program.entity';
import { REVIEW_STEPS, assertEditable, assertStep, assertVersion, canTake, isEditable, notesOpen, type ReviewStep } from '../../server/modules/programs/review-state';

const STATES: RevisionState[] = ['draft', 'in-review', 'released', 'superseded', 'withdrawn'];

// Written out by hand from the review rules the API has always applied (the table in review-state.ts must agree).
const ALLOWED: Record<ReviewStep, RevisionState[]> = {
  submit: ['draft'],
  approve: ['in-review'],
  reject: ['in-review'],
  withdraw: ['draft', 'in-review'],
};

const refusal = (fn: () => void): string | null => {
  try {
    fn();
    return null;
  } catch (e) {
    return (e as Error).message;
  }
};

describe('review state table', () => {
  it('allows each step from its states only, and nothing from released, superseded or withdrawn', () => {
    for (const step of Object.keys(ALLOWED) as ReviewStep[]) {
      for (const state of STATES) {
        expect(canTake(step, state), `${step} from ${state}`).toBe(ALLOWED[step].includes(state));
        const message = refusal(() => assertStep(step, { label: 'C', state }));
        expect(message === null, `${step} from ${state}: ${message}`).toBe(ALLOWED[step].includes(state));
      }
    }
    for (const state of ['released', 'superseded', 'withdrawn'] as const) {
      expect((Object.keys(REVIEW_STEPS) as ReviewStep[]).filter((s) => canTake(s, state))).toEqual([]);
    }
  });

  it('moves each step to its one next state', () => {
    expect(Object.fromEntries(Object.entries(REVIEW_STEPS).map(([k, t]) => [k, t.to]))).toEqual({ submit: 'in-review', approve: 'released', reject: 'draft', withdraw: 'withdrawn' });
    expect(REVIEW_STEPS.approve.who).toBe('independent-engineer');
    expect(REVIEW_STEPS.reject.who).toBe('independent-engineer');
  });

  it('says why a step is refused, naming the revision and its state', () => {
    expect(refusal(() => assertStep('submit', { label: 'B', state: 'released' }))).toBe('Revision B is released and cannot be submitted. Start a new revision from it to make changes.');
    expect(refusal(() => assertStep('submit', { label: 'B', state: 'in-review' }))).toBe('Revision B is in review; only a draft can be submitted.');
    expect(refusal(() => assertStep('approve', { label: 'B', state: 'draft' }))).toBe('Revision B is not in review (it is draft).');
    expect(refusal(() => assertStep('reject', { label: 'B', state: 'released' }))).toBe('Revision B is not in review (it is released).');
    expect(refusal(() => assertStep('withdraw', { label: 'B', state: 'superseded' }))).toBe('Revision B is superseded; only a draft or a revision in review can be withdrawn.');
  });

  it('edits a draft only; notes stay open in review; a stale version is refused', () => {
    expect(STATES.filter(isEditable)).toEqual(['draft']);
    expect(STATES.filter(notesOpen)).toEqual(['draft', 'in-review']);
    expect(refusal(() => assertEditable({ label: 'A', state: 'withdrawn' }, 'given waivers'))).toBe('Revision A is withdrawn; only a draft can be given waivers.');
    expect(refusal(() => assertVersion({ label: 'A', version: 4 }, 3))).toBe('Revision A was changed by someone else since you opened it (version 3, now 4). Reload to see their change, then make yours again.');
    expect(refusal(() => assertVersion({ label: 'A', version: 4 }, 4))).toBeNull();
  });
});
