import { useId } from 'react';
import type { ButtonHTMLAttributes, ReactNode } from 'react';

type TextFieldProps = {
  label: string;
  name: string;
  value: string;
  onChange: (value: string) => void;
  error?: string;
  type?: 'text' | 'email' | 'password';
  autoComplete?: string;
  hint?: string;
  autoFocus?: boolean;
};

export function TextField({ label, name, value, onChange, error, type = 'text', autoComplete, hint, autoFocus }: TextFieldProps) {
  const id = useId();
  const describedBy = [error ? `${id}-error` : null, hint ? `${id}-hint` : null].filter(Boolean).join(' ') || undefined;
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-bold text-ink">
        {label}
      </label>
      <input
        id={id}
        name={name}
        type={type}
        value={value}
        autoComplete={autoComplete}
        autoFocus={autoFocus}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy}
        onChange={(event) => onChange(event.target.value)}
        className={`rounded-lg border-2 bg-white px-3 py-2 text-ink outline-none transition focus:border-peel ${
          error ? 'border-alarm' : 'border-paper-edge'
        }`}
      />
      {hint && !error && (
        <p id={`${id}-hint`} className="text-xs text-ink-faint">
          {hint}
        </p>
      )}
      {error && (
        <p id={`${id}-error`} className="text-sm font-semibold text-alarm" role="alert">
          {error}
        </p>
      )}
    </div>
  );
}

type SelectFieldProps = {
  label: string;
  name: string;
  value: string;
  onChange: (value: string) => void;
  options: ReadonlyArray<{ value: string; label: string }>;
  error?: string;
};

export function SelectField({ label, name, value, onChange, options, error }: SelectFieldProps) {
  const id = useId();
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-bold text-ink">
        {label}
      </label>
      <select
        id={id}
        name={name}
        value={value}
        aria-invalid={error ? true : undefined}
        onChange={(event) => onChange(event.target.value)}
        className="rounded-lg border-2 border-paper-edge bg-white px-3 py-2 text-ink outline-none focus:border-peel"
      >
        {options.map((option) => (
          <option key={option.value} value={option.value}>
            {option.label}
          </option>
        ))}
      </select>
      {error && (
        <p className="text-sm font-semibold text-alarm" role="alert">
          {error}
        </p>
      )}
    </div>
  );
}

export function FormMessage({ tone = 'error', children }: { tone?: 'error' | 'ok'; children: ReactNode }) {
  if (!children) return null;
  const style = tone === 'error' ? 'border-alarm bg-alarm-light text-alarm' : 'border-sage bg-sage-light text-sage-deep';
  return (
    <div role={tone === 'error' ? 'alert' : 'status'} className={`rounded-lg border-2 px-3 py-2 text-sm font-semibold ${style}`}>
      {children}
    </div>
  );
}

type ButtonProps = ButtonHTMLAttributes<HTMLButtonElement> & { variant?: 'primary' | 'quiet' | 'danger'; busy?: boolean };

export function Button({ variant = 'primary', busy, children, className = '', disabled, ...rest }: ButtonProps) {
  const styles = {
    primary: 'bg-ink text-paper hover:bg-ink-soft',
    quiet: 'bg-transparent text-ink border-2 border-paper-edge hover:border-ink',
    danger: 'bg-alarm text-white hover:opacity-90',
  }[variant];
  return (
    <button
      {...rest}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      className={`inline-flex items-center justify-center gap-2 rounded-full px-5 py-2 font-bold transition disabled:opacity-60 ${styles} ${className}`}
    >
      {busy ? 'Working…' : children}
    </button>
  );
}
