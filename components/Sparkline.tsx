/** A small inline trend line (no axes); the numbers it draws are also given as text for screen readers. */
export function Sparkline({ values, label, width = 104, height = 26 }: { values: (number | null)[]; label: string; width?: number; height?: number }) {
  const points = values.map((v, i) => [i, v] as const).filter((p): p is readonly [number, number] => p[1] !== null);
  if (points.length < 2) return <span className="text-xs text-muted">too few weeks</span>;
  const ys = points.map((p) => p[1]);
  const lo = Math.min(...ys);
  const hi = Math.max(...ys);
  const span = hi - lo || 1;
  const n = Math.max(1, values.length - 1);
  const pad = 2;
  const xy = points.map(([i, v]) => [pad + (i / n) * (width - 2 * pad), pad + (1 - (v - lo) / span) * (height - 2 * pad)]);
  const last = xy[xy.length - 1];
  return (
    <svg width={width} height={height} viewBox={`0 0 ${width} ${height}`} role="img" aria-label={label} className="text-accent">
      <title>{label}</title>
      <polyline points={xy.map(([x, y]) => `${x.toFixed(1)},${y.toFixed(1)}`).join(' ')} fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinejoin="round" />
      <circle cx={last[0]} cy={last[1]} r="2.2" fill="currentColor" />
    </svg>
  );
}
