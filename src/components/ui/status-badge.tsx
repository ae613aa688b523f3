// Build status as a word plus a small shape (never colour alone).
import type { BuildStatus } from '@shared/api-types';

const look: Record<BuildStatus, { cls: string; shape: string; label: string }> = {
  planned: { cls: 'bg-ink-100 text-ink-700', shape: 'M5 1.5 A3.5 3.5 0 1 1 4.99 1.5', label: 'planned' },
  built: { cls: 'bg-amber-100 text-amber-700', shape: 'M1.5 1.5h7v7h-7z', label: 'built' },
  tested: { cls: 'bg-copper-100 text-copper-700', shape: 'M5 1 9 9H1z', label: 'tested' },
  reviewed: { cls: 'bg-moss-100 text-moss-700', shape: 'M1.5 5.2 4 7.8 8.8 2.2', label: 'reviewed' },
  discarded: { cls: 'bg-rust-100 text-rust-700', shape: 'M2 2 8 8M8 2 2 8', label: 'discarded' },
};

export function StatusBadge({ status }: { status: BuildStatus }) {
  const l = look[status];
  const filled = status === 'built' || status === 'tested';
  return (
    <span className={`inline-flex items-center gap-1 rounded-full px-2 py-0.5 text-xs font-medium ${l.cls}`}>
      <svg aria-hidden width="10" height="10" viewBox="0 0 10 10">
        <path d={l.shape} fill={filled ? 'currentColor' : 'none'} stroke="currentColor" strokeWidth="1.5" strokeLinecap="round" strokeLinejoin="round" />
      </svg>
      {l.label}
    </span>
  );
}
