import type { ReactNode } from 'react';

/** A labelled form control with its error text tied to it for screen readers. */
export function FormField({ id, label, hint, errors, children }: { id: string; label: string; hint?: string; errors?: string[]; children: ReactNode }) {
  return (
    <div>
      <label htmlFor={id} className="tp-label">
        {label}
      </label>
      {children}
      {hint && !errors?.length && (
        <p id={`${id}-hint`} className="mt-1 text-xs text-muted">
          {hint}
        </p>
      )}
      {errors?.map((message) => (
        <p key={message} id={`${id}-error`} className="tp-field-error">
          <span aria-hidden="true">✕ </span>
          {message}
        </p>
      ))}
    </div>
  );
}
