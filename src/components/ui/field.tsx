// A labelled form control with its hint and inline error, wired for screen readers.
import { useId, type ReactNode, type InputHTMLAttributes, type SelectHTMLAttributes, type TextareaHTMLAttributes, forwardRef } from 'react';

export function Field({ label, hint, error, children, id }: { label: string; hint?: ReactNode; error?: string; children: (props: { id: string; 'aria-invalid': boolean; 'aria-describedby'?: string }) => ReactNode; id?: string }) {
  const generated = useId();
  const fieldId = id ?? generated;
  const describedBy = error ? `${fieldId}-error` : hint ? `${fieldId}-hint` : undefined;
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={fieldId} className="text-xs font-medium text-ink-700">{label}</label>
      {children({ id: fieldId, 'aria-invalid': Boolean(error), 'aria-describedby': describedBy })}
      {error ? (
        <p id={`${fieldId}-error`} role="alert" className="text-xs text-rust-700">{error}</p>
      ) : hint ? (
        <p id={`${fieldId}-hint`} className="text-xs text-ink-500">{hint}</p>
      ) : null}
    </div>
  );
}

const control = 'rounded-md border border-line bg-white px-2.5 py-1.5 text-sm text-ink-900 placeholder:text-ink-500 aria-[invalid=true]:border-rust-700 focus:border-copper-500 focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-copper-500';

/** Full width unless the caller sets a width of its own (two width classes would fight). */
const classes = (className: string) => `${control} ${/(^|\s)(w-|max-w-)/.test(className) ? '' : 'w-full'} ${className}`;

export const Input = forwardRef<HTMLInputElement, InputHTMLAttributes<HTMLInputElement>>(function Input({ className = '', ...props }, ref) {
  return <input ref={ref} className={classes(className)} {...props} />;
});

export const Select = forwardRef<HTMLSelectElement, SelectHTMLAttributes<HTMLSelectElement>>(function Select({ className = '', ...props }, ref) {
  return <select ref={ref} className={classes(className)} {...props} />;
});

export const Textarea = forwardRef<HTMLTextAreaElement, TextareaHTMLAttributes<HTMLTextAreaElement>>(function Textarea({ className = '', ...props }, ref) {
  return <textarea ref={ref} className={classes(className)} {...props} />;
});
