// Password strength: the zxcvbn estimator (zxcvbn-ts, with its common and English dictionaries),
// the same on the server (which decides) and in the browser (which shows the feedback as you type).
import { ZxcvbnFactory } from '@zxcvbn-ts/core';
import * as common from '@zxcvbn-ts/language-common';
import * as en from '@zxcvbn-ts/language-en';

/**
 * The lowest zxcvbn score accepted, on its scale of 0 to 4. 3 is "safely unguessable: moderate
 * protection from an offline slow-hash scenario" in zxcvbn's own description of its scores, and
 * is the usual minimum (common practice); our hashes are bcrypt, a slow hash.
 */
export const MIN_PASSWORD_SCORE = 3;

export interface PasswordStrength {
  /** 0 (guessed at once) … 4 (very hard to guess) */
  score: 0 | 1 | 2 | 3 | 4;
  ok: boolean;
  /** a word for the score, e.g. "weak" */
  label: string;
  /** what is wrong with it, e.g. "This is a top-10 common password.", or null */
  warning: string | null;
  /** what would make it better */
  suggestions: string[];
  /** one sentence for a form or an error body; empty when ok */
  message: string;
}

const LABELS = ['very weak', 'weak', 'fair', 'strong', 'very strong'] as const;

let factory: ZxcvbnFactory | null = null;
function estimator(): ZxcvbnFactory {
  factory ??= new ZxcvbnFactory({
    dictionary: { ...common.dictionary, ...en.dictionary },
    graphs: common.adjacencyGraphs,
    translations: en.translations,
  });
  return factory;
}

/**
 * How hard `password` is to guess. `userInputs` (the person's e-mail, name…) count as known
 * words: a password made of them is weak. Only the first 100 characters are weighed, as the
 * estimator does by default (longer ones are strong anyway).
 */
export function passwordStrength(password: string, userInputs: string[] = []): PasswordStrength {
  const inputs = userInputs.flatMap((s) => [s, ...s.split(/[^\p{L}\p{N}]+/u)]).filter((s) => s.length >= 3);
  const r = estimator().check(password, inputs);
  const score = r.score;
  const ok = score >= MIN_PASSWORD_SCORE;
  const warning = r.feedback.warning || null;
  const suggestions = r.feedback.suggestions.length ? r.feedback.suggestions : ok ? [] : ['Add more words that are less common.'];
  const message = ok ? '' : [`This password is too easy to guess (${LABELS[score]}: ${score} of 4, at least ${MIN_PASSWORD_SCORE} needed).`, warning, ...suggestions].filter(Boolean).join(' ');
  return { score, ok, label: LABELS[score], warning, suggestions, message };
}
