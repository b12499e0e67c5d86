import {
  forwardRef,
  useId,
  type InputHTMLAttributes,
  type ReactNode,
  type SelectHTMLAttributes,
} from 'react';
import { cn } from '@/lib/cn';

/** Input look without a width (callers set one). */
export const inputClass =
  'h-8 rounded border border-steel-300 bg-white px-2 text-sm text-steel-900 focus:border-copper-500 focus:outline-none disabled:bg-steel-100 disabled:text-steel-500 aria-[invalid=true]:border-red-500';
const fieldInputClass = `${inputClass} w-full`;

interface FieldShellProps {
  readonly label: string;
  readonly unit?: string;
  readonly error?: string;
  readonly hint?: string;
  readonly children: (id: string, describedBy: string | undefined) => ReactNode;
  readonly className?: string;
}

/** Label + control + unit + error message; the message is announced and linked to the control. */
export function FieldShell({ label, unit, error, hint, children, className }: FieldShellProps) {
  const id = useId();
  const msgId = `${id}-msg`;
  return (
    <div className={cn('flex flex-col gap-0.5', className)}>
      <label htmlFor={id} className="text-xs font-medium text-steel-600">
        {label}
        {unit ? <span className="font-normal text-steel-400"> ({unit})</span> : null}
      </label>
      {children(id, error || hint ? msgId : undefined)}
      {error ? (
        <p id={msgId} role="alert" className="text-xs text-red-700">
          {error}
        </p>
      ) : hint ? (
        <p id={msgId} className="text-xs text-steel-500">
          {hint}
        </p>
      ) : null}
    </div>
  );
}

export interface TextFieldProps extends InputHTMLAttributes<HTMLInputElement> {
  readonly label: string;
  readonly unit?: string;
  readonly error?: string;
  readonly hint?: string;
}

export const TextField = forwardRef<HTMLInputElement, TextFieldProps>(function TextField(
  { label, unit, error, hint, className, ...rest },
  ref,
) {
  return (
    <FieldShell label={label} unit={unit} error={error} hint={hint} className={className}>
      {(id, describedBy) => (
        <input
          ref={ref}
          id={id}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy}
          className={fieldInputClass}
          {...rest}
        />
      )}
    </FieldShell>
  );
});

export interface SelectFieldProps extends SelectHTMLAttributes<HTMLSelectElement> {
  readonly label: string;
  readonly error?: string;
  readonly hint?: string;
  readonly options: readonly { value: string; label: string }[];
}

export const SelectField = forwardRef<HTMLSelectElement, SelectFieldProps>(function SelectField(
  { label, error, hint, options, className, ...rest },
  ref,
) {
  return (
    <FieldShell label={label} error={error} hint={hint} className={className}>
      {(id, describedBy) => (
        <select
          ref={ref}
          id={id}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy}
          className={fieldInputClass}
          {...rest}
        >
          {options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </select>
      )}
    </FieldShell>
  );
});
