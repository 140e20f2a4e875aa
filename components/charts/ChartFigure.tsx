import type { ReactNode } from 'react';

/** A chart's figures as a table, for people who would rather read than look, and for screen readers. */
export interface ChartTable {
  summary: string;
  head: string[];
  rows: { key: string | number; cells: ReactNode[] }[];
}

/**
 * A chart in a card: its caption, the chart (or, with no data, a line saying why) and below it the
 * same figures as a table that opens on demand.
 */
export function ChartFigure({ title, unit, empty, table, children }: { title: string; unit: string; empty: string | null; table: ChartTable; children: ReactNode }) {
  return (
    <figure className="tp-card p-4">
      <figcaption className="mb-2 font-semibold">
        {title} <span className="font-normal text-muted">({unit})</span>
      </figcaption>
      {empty ? (
        <p className="text-muted">{empty}</p>
      ) : (
        <>
          {children}
          <details className="mt-2 text-sm">
            <summary className="cursor-pointer text-accent">{table.summary}</summary>
            <div className="max-h-64 overflow-auto">
              <table className="mt-2 w-full text-left font-mono text-xs">
                <thead>
                  <tr>
                    {table.head.map((heading) => (
                      <th key={heading} scope="col" className="pr-3">
                        {heading}
                      </th>
                    ))}
                  </tr>
                </thead>
                <tbody>
                  {table.rows.map((row) => (
                    <tr key={row.key}>
                      {row.cells.map((cell, i) => (
                        <td key={i} className="pr-3">
                          {cell}
                        </td>
                      ))}
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          </details>
        </>
      )}
    </figure>
  );
}
