export default function LoadingTake() {
  return (
    <div role="status" className="space-y-4">
      <p className="text-muted">Loading the take, its waveform and measures…</p>
      <div className="tp-card h-48 animate-pulse bg-sunken" aria-hidden="true" />
      <div className="grid gap-4 lg:grid-cols-2" aria-hidden="true">
        <div className="tp-card h-64 animate-pulse bg-sunken" />
        <div className="tp-card h-64 animate-pulse bg-sunken" />
      </div>
    </div>
  );
}
