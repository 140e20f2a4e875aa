import type { DeliverySpec } from '@/dsp/spec';
import type { AnalysisReport } from '@/dsp/types';
import { CHECK_LABEL, measureRows, untimedFindings } from '@/lib/review/reportView';
import { MeasureMark, SeverityMark } from './marks';

/** Every measure of the take with its mark and a sentence on what it means. */
export function MeasuresPanel({ report, spec }: { report: AnalysisReport; spec: DeliverySpec }) {
  const rows = measureRows(report, spec);
  const other = untimedFindings(report);
  return (
    <section className="tp-card p-4" aria-labelledby="measures-heading">
      <h2 id="measures-heading" className="text-lg font-semibold">
        Measures
      </h2>
      <p className="text-xs text-muted">Judged against “{spec.name}”.</p>
      <dl className="mt-3 divide-y divide-line" data-testid="measures">
        {rows.map((row) => (
          <div key={row.key} className="grid grid-cols-[4.75rem_minmax(0,1fr)] gap-x-3 py-2.5" data-testid={`measure-${row.key}`}>
            <dt className="col-span-2 flex gap-3">
              <MeasureMark mark={row.mark} />
              <span className="font-semibold">{row.title}</span>
            </dt>
            <dd className="col-start-2 font-mono text-sm">{row.value}</dd>
            <dd className="col-start-2 text-sm text-muted">{row.explanation}</dd>
          </div>
        ))}
      </dl>
      {other.length > 0 && (
        <>
          <h3 className="mt-4 font-semibold">Findings for the whole take</h3>
          <ul className="mt-1 space-y-1 text-sm">
            {other.map((f, i) => (
              <li key={i} className="flex gap-2">
                <SeverityMark severity={f.severity} />
                <span>
                  <span className="font-semibold">{CHECK_LABEL[f.check]}:</span> {f.message}
                </span>
              </li>
            ))}
          </ul>
        </>
      )}
    </section>
  );
}
