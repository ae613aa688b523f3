// Buttons: one copper primary, quiet secondary, and a danger variant for destructive actions.
// LinkButton is a link that looks like a button (never a button inside a link).
import type { ComponentProps } from 'react';
import { Link, type LinkProps } from 'react-router-dom';

type Variant = 'primary' | 'secondary' | 'danger' | 'ghost';

const styles: Record<Variant, string> = {
  primary: 'bg-copper-600 text-white hover:bg-copper-700 disabled:bg-copper-600/50',
  secondary: 'bg-white text-ink-900 border border-line hover:bg-ink-100 disabled:opacity-50',
  danger: 'bg-white text-rust-700 border border-rust-700/40 hover:bg-rust-100 disabled:opacity-50',
  ghost: 'text-ink-700 hover:bg-ink-100 disabled:opacity-50',
};

const base = 'inline-flex items-center justify-center gap-1.5 rounded-md px-3 py-1.5 text-sm font-medium transition-colors focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-copper-500';

export function Button({ variant = 'secondary', className = '', ...props }: ComponentProps<'button'> & { variant?: Variant }) {
  return <button type="button" className={`${base} disabled:cursor-not-allowed ${styles[variant]} ${className}`} {...props} />;
}

export function LinkButton({ variant = 'secondary', className = '', ...props }: LinkProps & { variant?: Variant }) {
  return <Link className={`${base} ${styles[variant]} ${className}`} {...props} />;
}
