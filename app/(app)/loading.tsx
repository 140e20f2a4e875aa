export default function Loading() {
  return (
    <p className="text-muted" role="status">
      Loading…
    </p>
  );
}
