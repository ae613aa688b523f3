// Page furniture: a page header, titled panels, empty states and error notes.
import type { ReactNode } from 'react';
import { ApiError } from '@/lib/api-client';

export function PageHeader({ title, subtitle, actions, eyebrow }: { title: ReactNode; subtitle?: ReactNode; actions?: ReactNode; eyebrow?: ReactNode }) {
  return (
    <header className="mb-5 flex flex-wrap items-end justify-between gap-3">
      <div className="min-w-0">
        {eyebrow && <div className="mb-1 text-xs font-medium uppercase tracking-wide text-ink-500">{eyebrow}</div>}
        <h1 className="text-xl font-semibold text-ink-950">{title}</h1>
        {subtitle && <p className="mt-1 max-w-3xl text-sm text-ink-500">{subtitle}</p>}
      </div>
      {actions && <div className="flex flex-wrap items-center gap-2">{actions}</div>}
    </header>
  );
}

export function Panel({ title, actions, children, className = '', bodyClassName = 'p-4' }: { title?: ReactNode; actions?: ReactNode; children: ReactNode; className?: string; bodyClassName?: string }) {
  return (
    <section className={`rounded-lg border border-line bg-panel shadow-[0_1px_0_rgba(17,26,46,0.04)] ${className}`}>
      {(title || actions) && (
        <div className="flex items-center justify-between gap-2 border-b border-line px-4 py-2.5">
          <h2 className="text-sm font-semibold text-ink-900">{title}</h2>
          {actions && <div className="flex items-center gap-2">{actions}</div>}
        </div>
      )}
      <div className={bodyClassName}>{children}</div>
    </section>
  );
}

export function EmptyState({ title, children, action }: { title: string; children?: ReactNode; action?: ReactNode }) {
  return (
    <div className="flex flex-col items-center justify-center gap-2 rounded-md border border-dashed border-line px-6 py-8 text-center">
      <svg aria-hidden width="36" height="36" viewBox="0 0 36 36" className="text-ink-300">
        <path d="M4 30 H32 M6 28 C 12 8, 20 8, 30 12" stroke="currentColor" strokeWidth="2" fill="none" strokeLinecap="round" />
      </svg>
      <p className="text-sm font-medium text-ink-800">{title}</p>
      {children && <div className="max-w-md text-sm text-ink-500">{children}</div>}
      {action}
    </div>
  );
}

export function ErrorNote({ error }: { error: unknown }) {
  if (!error) return null;
  const message = error instanceof ApiError ? error.message : error instanceof Error ? error.message : String(error);
  return (
    <div role="alert" className="rounded-md border border-rust-700/30 bg-rust-100 px-3 py-2 text-sm text-rust-700">
      {message}
    </div>
  );
}

export function Loading({ label = 'Loading…' }: { label?: string }) {
  return (
    <div className="flex items-center gap-2 py-6 text-sm text-ink-500" role="status">
      <span className="h-3 w-3 animate-spin rounded-full border-2 border-ink-300 border-t-copper-500" aria-hidden />
      {label}
    </div>
  );
}

export function SafetyNote({ children }: { children: ReactNode }) {
  return (
    <div role="note" className="flex gap-2 rounded-md border border-amber-700/30 bg-amber-100 px-3 py-2 text-sm text-amber-700">
      <svg aria-hidden width="18" height="18" viewBox="0 0 18 18" className="mt-0.5 shrink-0"><path d="M9 1.5 17 16H1z" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinejoin="round" /><path d="M9 7v4M9 13v.5" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" /></svg>
      <div>{children}</div>
    </div>
  );
}
