/**
 * Shown while a session list or session page loads. Manager pages have no loading boundary on
 * purpose: they render whole before answering, so a refused visit can answer HTTP 403.
 */
export default function Loading() {
  return (
    <p className="text-muted" role="status">
      Loading…
    </p>
  );
}
