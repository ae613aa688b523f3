// A short explanation shown beside a value on hover and on keyboard focus (not only on hover, as
// a title attribute would be), and read out by screen readers as the value's description.
import { useId, type ReactNode } from 'react';

export function Hint({ hint, children, className = '', role }: { hint: ReactNode; children: ReactNode; className?: string; role?: 'listitem' | 'group' }) {
  const id = useId();
  return (
    <div tabIndex={0} role={role} aria-describedby={id} className={`group relative cursor-help rounded-sm ${className}`}>
      {children}
      <div
        id={id}
        role="tooltip"
        className="pointer-events-none absolute left-0 top-full z-20 mt-1 hidden w-72 max-w-[70vw] whitespace-pre-line rounded-md border border-line bg-white px-3 py-2 text-xs leading-snug text-ink-800 shadow-lg group-hover:block group-focus-visible:block"
      >
        {hint}
      </div>
    </div>
  );
}
