import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'secondary' | 'danger' | 'ghost';

const styles: Record<Variant, string> = {
  primary: 'bg-copper-500 text-white hover:bg-copper-600 disabled:bg-copper-300',
  secondary: 'bg-white text-ink-800 border border-ink-300 hover:bg-ink-100 disabled:text-ink-400',
  danger: 'bg-sev-error text-white hover:brightness-95 disabled:opacity-50',
  ghost: 'text-ink-700 hover:bg-ink-100 disabled:text-ink-400',
};

export function Button({ variant = 'primary', className = '', type = 'button', ...rest }: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return (
    <button
      type={type}
      className={`inline-flex items-center justify-center gap-1.5 rounded px-3 py-1.5 text-sm font-medium transition-colors disabled:cursor-not-allowed ${styles[variant]} ${className}`}
      {...rest}
    />
  );
}
