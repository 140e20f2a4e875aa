import { describe, expect, it } from 'vitest';
import { converterAlerts, isCheckOverdue } from '@/lib/fleet/alerts';
import { driftFindings, isAcceptable, stateOfFindings } from '@/lib/converterChecks/views';
import type { ConverterFinding } from '@/dsp/converter/report';

// A fixed instant: nothing here depends on today's date.
const NOW = new Date('2026-06-01T12:00:00Z');
const daysBefore = (days: number) => new Date(NOW.getTime() - days * 86_400_000).toISOString();
const base = { recorderId: 7, label: 'Booth test interface', intervalDays: 90 };

describe('converter alerts of the fleet', () => {
  it('raises nothing for a recorder that was never checked: there is nothing to compare or to be late with', () => {
    expect(converterAlerts({ ...base, latest: null }, NOW)).toEqual([]);
  });

  it('calls a check overdue only once the studio’s interval has passed', () => {
    expect(isCheckOverdue(daysBefore(90), 90, NOW)).toBe(false);
    expect(isCheckOverdue(daysBefore(91), 90, NOW)).toBe(true);
    const alerts = converterAlerts({ ...base, latest: { checkId: 1, measuredAt: daysBefore(120), drift: [] } }, NOW);
    expect(alerts.map((a) => [a.kind, a.severity])).toEqual([['converter-overdue', 'warn']]);
    expect(alerts[0].message).toContain(daysBefore(120).slice(0, 10));
    expect(alerts[0].message).toContain('90 days');
  });

  it('names the first drift in plain words and counts the others', () => {
    const drift = ['Left channel’s idle noise rose 7.9 dB since the baseline.', 'Left channel lost 1.89 effective bits since the baseline.'];
    const [alert] = converterAlerts({ ...base, latest: { checkId: 2, measuredAt: daysBefore(3), drift } }, NOW);
    expect(alert.kind).toBe('converter-drift');
    expect(alert.message).toContain(drift[0]);
    expect(alert.message).toContain('1 other change');
  });
});

describe('a converter check’s state', () => {
  const finding = (severity: ConverterFinding['severity'], basis: ConverterFinding['basis']): ConverterFinding => ({ check: 'noise', severity, basis, message: `${severity} ${basis}` });

  it('is the worst severity, info counting as a pass', () => {
    expect(stateOfFindings([])).toBe('pass');
    expect(stateOfFindings([finding('info', 'baseline')])).toBe('pass');
    expect(stateOfFindings([finding('warn', 'baseline'), finding('info', 'check')])).toBe('warn');
    expect(stateOfFindings([finding('warn', 'baseline'), finding('fail', 'threshold')])).toBe('fail');
  });

  it('drifts only on warnings against the baseline, and cannot be a baseline when the check itself failed', () => {
    expect(driftFindings([finding('info', 'baseline'), finding('warn', 'baseline'), finding('fail', 'threshold')]).map((f) => f.message)).toEqual(['warn baseline']);
    expect(isAcceptable([finding('fail', 'threshold')])).toBe(true);
    expect(isAcceptable([finding('fail', 'check')])).toBe(false);
  });
});
