/**
 * The outcome line under a form: an error (✕, read out at once) or a confirmation (✓, polite).
 * Renders nothing when there is no message.
 */
export function FormMessage({ error, notice, className = '' }: { error?: string | null; notice?: string | null; className?: string }) {
  if (error) {
    return (
      <p role="alert" className={`tp-field-error ${className}`}>
        <span aria-hidden="true">✕ </span>
        {error}
      </p>
    );
  }
  if (notice) {
    return (
      <p role="status" className={`text-sm text-pass ${className}`}>
        <span aria-hidden="true">✓ </span>
        {notice}
      </p>
    );
  }
  return null;
}
