import { useEffect, useState } from 'react';
import type { PasswordStrength } from '../../../../shared/password-strength';

/**
 * The strength of a new password as it is typed: the same estimator and minimum the server
 * applies (its dictionaries load on first use, in their own chunk). `userInputs`: the person's
 * e-mail and name, which make a password easy to guess.
 */
export function usePasswordStrength(password: string, userInputs: string[] = []): PasswordStrength | null {
  const [strength, setStrength] = useState<PasswordStrength | null>(null);
  const inputsKey = userInputs.join('\n');
  useEffect(() => {
    if (!password) {
      setStrength(null);
      return;
    }
    let live = true;
    void import('../../../../shared/password-strength').then((m) => {
      if (live) setStrength(m.passwordStrength(password, inputsKey ? inputsKey.split('\n') : []));
    });
    return () => {
      live = false;
    };
  }, [password, inputsKey]);
  return strength;
}

const BAR = ['bg-sev-error', 'bg-sev-error', 'bg-sev-warning', 'bg-mask-500', 'bg-mask-600'];

/** A five-step bar, the word for the score, and what would help when it is too weak. */
export function PasswordStrengthNote({ strength }: { strength: PasswordStrength | null }) {
  if (!strength) return null;
  return (
    <div role="status" aria-live="polite" aria-label="Password strength" className="flex flex-col gap-1 text-xs">
      <div className="flex gap-1" aria-hidden="true">
        {[0, 1, 2, 3, 4].map((i) => (
          <span key={i} className={`h-1 flex-1 rounded ${i <= strength.score ? BAR[strength.score] : 'bg-ink-200'}`} />
        ))}
      </div>
      <p className={strength.ok ? 'text-ink-600' : 'text-sev-error'}>
        Strength: {strength.label} ({strength.score} of 4). {strength.ok ? 'Good.' : strength.message.replace(/^This password is too easy to guess \([^)]*\)\.\s*/, 'Too easy to guess. ')}
      </p>
    </div>
  );
}
