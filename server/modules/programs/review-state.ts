// The review of a revision as a state table: which step goes from which state to which, and who
// may take it. The services check a step with assertStep before they change anything; the
// revision page asks canTake to show the buttons; both read this one table.
//
//   step       from                 to          who
//   submit     draft                in-review   an engineer
//   approve    in-review            released    an engineer who made none of its changes (four eyes);
//                                               the revision released before it becomes superseded
//   reject     in-review            draft       an engineer who made none of its changes
//   withdraw   draft, in-review     withdrawn   an engineer
//
// Only a draft is edited (file, settings, overrides, waivers, checks); review notes and the canvas
// underlay stay open while the revision is in review. "An engineer" is the routes' role
// (program.router.ts); the four-eyes rule is contributors.ts (assertIndependentReviewer).
import type { ProgramRevision, RevisionState } from '../../db/entities/program.entity';
import { ConflictError } from '../../lib/errors';

export type ReviewStep = 'submit' | 'approve' | 'reject' | 'withdraw';

/** Who may take a step: any engineer, or only one who made none of the revision's changes. */
export type StepTaker = 'engineer' | 'independent-engineer';

interface Transition {
  from: readonly RevisionState[];
  to: RevisionState;
  who: StepTaker;
}

export const REVIEW_STEPS: Readonly<Record<ReviewStep, Transition>> = {
  submit: { from: ['draft'], to: 'in-review', who: 'engineer' },
  approve: { from: ['in-review'], to: 'released', who: 'independent-engineer' },
  reject: { from: ['in-review'], to: 'draft', who: 'independent-engineer' },
  withdraw: { from: ['draft', 'in-review'], to: 'withdrawn', who: 'engineer' },
};

/** The states in which a revision's inputs, checks and waivers can change. */
const EDITABLE: readonly RevisionState[] = ['draft'];
/** The states in which review notes and the canvas underlay can change. */
const NOTES_OPEN: readonly RevisionState[] = ['draft', 'in-review'];

export const canTake = (step: ReviewStep, state: RevisionState): boolean => REVIEW_STEPS[step].from.includes(state);
export const isEditable = (state: RevisionState): boolean => EDITABLE.includes(state);
export const notesOpen = (state: RevisionState): boolean => NOTES_OPEN.includes(state);

type RevisionLike = Pick<ProgramRevision, 'label' | 'state'>;

/** Refuses (409) a step the revision's state does not allow, saying why. */
export function assertStep(step: ReviewStep, r: RevisionLike): void {
  if (canTake(step, r.state)) return;
  if (step === 'submit') assertEditable(r, 'submitted');
  else if (step === 'withdraw') throw new ConflictError(`Revision ${r.label} is ${r.state}; only a draft or a revision in review can be withdrawn.`);
  else throw new ConflictError(`Revision ${r.label} is not in review (it is ${r.state}).`);
}

/** Refuses (409) a change to a revision that is not a draft; `what` completes "cannot be …". */
export function assertEditable(r: RevisionLike, what = 'changed'): void {
  if (r.state === 'released' || r.state === 'superseded') {
    throw new ConflictError(`Revision ${r.label} is ${r.state} and cannot be ${what}. Start a new revision from it to make changes.`);
  }
  if (!isEditable(r.state)) {
    throw new ConflictError(`Revision ${r.label} is ${r.state === 'in-review' ? 'in review' : r.state}; only a draft can be ${what}.`);
  }
}

/** Refuses (409) a change made from an older version of the revision (optimistic locking). */
export function assertVersion(r: Pick<ProgramRevision, 'label' | 'version'>, version: number): void {
  if (r.version !== version) {
    throw new ConflictError(`Revision ${r.label} was changed by someone else since you opened it (version ${version}, now ${r.version}). Reload to see their change, then make yours again.`);
  }
}
