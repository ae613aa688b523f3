// Buttons: one copper primary, quiet secondary, and a danger variant for destructive actions.
import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'secondary' | 'danger' | 'ghost';

const styles: Record<Variant, string> = {
  primary: 'bg-copper-600 text-white hover:bg-copper-700 disabled:bg-copper-600/50',
  secondary: 'bg-white text-ink-900 border border-line hover:bg-ink-100 disabled:opacity-50',
  danger: 'bg-white text-rust-700 border border-rust-700/40 hover:bg-rust-100 disabled:opacity-50',
  ghost: 'text-ink-700 hover:bg-ink-100 disabled:opacity-50',
};

export function Button({ variant = 'secondary', className = '', ...props }: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return (
    <button
      type="button"
      className={`inline-flex items-center justify-center gap-1.5 rounded-md px-3 py-1.5 text-sm font-medium transition-colors disabled:cursor-not-allowed ${styles[variant]} ${className}`}
      {...props}
    />
  );
}
