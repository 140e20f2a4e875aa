/**
 * The outcome line under a form: an error (✕, read out at once) or a confirmation (✓, polite).
 * Renders nothing when there is no message; `inline` renders it as a span inside a line of controls.
 */
export function FormMessage({ error, notice, className = '', inline = false, testId }: { error?: string | null; notice?: string | null; className?: string; inline?: boolean; testId?: string }) {
  const Tag = inline ? 'span' : 'p';
  if (error) {
    return (
      <Tag role="alert" data-testid={testId} className={`tp-field-error ${className}`}>
        <span aria-hidden="true">✕ </span>
        {error}
      </Tag>
    );
  }
  if (notice) {
    return (
      <Tag role="status" data-testid={testId} className={`text-sm text-pass ${className}`}>
        <span aria-hidden="true">✓ </span>
        {notice}
      </Tag>
    );
  }
  return null;
}
