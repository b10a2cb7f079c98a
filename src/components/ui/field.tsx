import { forwardRef, useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';
import { cx } from './cx';

const CONTROL = 'block w-full rounded-lg border-0 bg-white px-3 py-2 text-sm text-ink-900 ring-1 ring-inset ring-ink-200 placeholder:text-ink-400 focus:ring-2 focus:ring-lamp-500 disabled:bg-ink-50';

type FieldShell = { label: ReactNode; error?: string; hint?: ReactNode; className?: string };

function Shell({ id, label, error, hint, className, children }: FieldShell & { id: string; children: ReactNode }) {
  return (
    <div className={className}>
      <label htmlFor={id} className="mb-1 block text-sm font-medium text-ink-800">{label}</label>
      {children}
      {hint && !error && <p id={`${id}-hint`} className="mt-1 text-xs text-ink-500">{hint}</p>}
      {error && <p id={`${id}-error`} role="alert" className="mt-1 text-xs font-medium text-short-600">{error}</p>}
    </div>
  );
}

export const TextField = forwardRef<HTMLInputElement, FieldShell & InputHTMLAttributes<HTMLInputElement>>(function TextField({ label, error, hint, className, id, ...rest }, ref) {
  const auto = useId();
  const fieldId = id ?? auto;
  return (
    <Shell id={fieldId} label={label} error={error} hint={hint} className={className}>
      <input ref={ref} id={fieldId} aria-invalid={error ? true : undefined} aria-describedby={error ? `${fieldId}-error` : hint ? `${fieldId}-hint` : undefined} className={cx(CONTROL, error && 'ring-short-500')} {...rest} />
    </Shell>
  );
});

export const SelectField = forwardRef<HTMLSelectElement, FieldShell & SelectHTMLAttributes<HTMLSelectElement>>(function SelectField({ label, error, hint, className, id, children, ...rest }, ref) {
  const auto = useId();
  const fieldId = id ?? auto;
  return (
    <Shell id={fieldId} label={label} error={error} hint={hint} className={className}>
      <select ref={ref} id={fieldId} aria-invalid={error ? true : undefined} className={cx(CONTROL, 'pr-8', error && 'ring-short-500')} {...rest}>{children}</select>
    </Shell>
  );
});

export const TextAreaField = forwardRef<HTMLTextAreaElement, FieldShell & TextareaHTMLAttributes<HTMLTextAreaElement>>(function TextAreaField({ label, error, hint, className, id, ...rest }, ref) {
  const auto = useId();
  const fieldId = id ?? auto;
  return (
    <Shell id={fieldId} label={label} error={error} hint={hint} className={className}>
      <textarea ref={ref} id={fieldId} aria-invalid={error ? true : undefined} className={cx(CONTROL, error && 'ring-short-500')} {...rest} />
    </Shell>
  );
});
