import type { FigureRow } from '@/lib/converterChecks/figures';

const fixed = (v: number | null, decimals: number) => (v === null ? '—' : v.toFixed(decimals).replace('-', '−'));
const signed = (v: number, decimals: number) => `${v > 0 ? '+' : v < 0 ? '−' : '±'}${Math.abs(v).toFixed(decimals)}`;

/** Figures of a converter check: one column per channel (or one for the whole check), each value over its change since the baseline, and the limit. */
export function FigureTable({ caption, columns, rows }: { caption: string; columns: string[]; rows: FigureRow[] }) {
  const hasBaseline = rows.some((r) => r.baseline !== null);
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-sunken text-muted">
          <tr>
            <th scope="col" className="px-3 py-2 font-semibold">Measure</th>
            {columns.map((c) => (
              <th key={c} scope="col" className="px-3 py-2 font-semibold">
                {c}
              </th>
            ))}
            <th scope="col" className="px-3 py-2 font-semibold">Limit</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.label} className="border-t border-line align-top">
              <th scope="row" className="px-3 py-2 font-normal">
                {r.label} <span className="text-muted">({r.unit})</span>
              </th>
              {r.values.map((v, i) => {
                const then = r.baseline?.[i] ?? null;
                return (
                  <td key={i} className="px-3 py-2 font-mono">
                    {fixed(v, r.decimals)}
                    {hasBaseline && (
                      <span className="block text-xs text-muted">{then === null ? 'baseline —' : `baseline ${fixed(then, r.decimals)}${v !== null ? ` (${signed(v - then, r.decimals)})` : ''}`}</span>
                    )}
                  </td>
                );
              })}
              <td className="px-3 py-2 text-xs">{r.limit ?? '—'}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
