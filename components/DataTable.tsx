import type { ReactNode } from 'react';

/**
 * A table of records inside a card: the header row and the rows given, scrolling sideways on a
 * narrow window; or, with no rows, a line saying so.
 */
export function DataTable({ head, empty, testId, children }: { head: string[]; empty: string | null; testId?: string; children: ReactNode }) {
  if (empty) return <p className="p-6 text-muted">{empty}</p>;
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-sm" data-testid={testId}>
        <thead className="bg-sunken text-muted">
          <tr>
            {head.map((heading) => (
              <th key={heading} scope="col" className="px-4 py-2 font-semibold">
                {heading}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>{children}</tbody>
      </table>
    </div>
  );
}
