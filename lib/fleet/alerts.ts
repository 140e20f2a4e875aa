/**
 * Fleet alerts: a pure judgement of one recorder's aggregates (computed in SQL by lib/fleet/service.server.ts).
 * Safe to import from the browser. Every threshold here is a Takeproof project default.
 */

export interface AlertSettings {
  /** Noise-floor rise against the recorder's own baseline that raises an alert, dB. Project default: 3 dB. */
  driftDb: number;
  /** The recent window the alerts look at, days. */
  recentDays: number;
  /** The baseline: the takes of this many days before the recent window. */
  baselineDays: number;
  /** Fewest takes each side of the split before a drift is judged at all. */
  minBaselineTakes: number;
  minRecentTakes: number;
  /** Recent takes below the spec's effective-bits minimum that raise an alert. */
  lowBitsTakes: number;
  /** Recent takes with below-full-scale clipping that count as "repeated". */
  belowFullScaleTakes: number;
  /** Recent takes whose audio disagrees with the declared sample rate that raise an alert. */
  rateMismatchTakes: number;
}

export const DEFAULT_ALERT_SETTINGS: AlertSettings = {
  driftDb: 3,
  recentDays: 14,
  baselineDays: 90,
  minBaselineTakes: 5,
  minRecentTakes: 3,
  lowBitsTakes: 2,
  belowFullScaleTakes: 3,
  rateMismatchTakes: 1,
};

/** What SQL hands over per recorder: its baseline (before the recent window) and its recent window. */
export interface RecorderHealth {
  recorderId: number;
  label: string;
  baseline: { takes: number; medianFloorDbfs: number | null };
  recent: {
    takes: number;
    medianFloorDbfs: number | null;
    minEffectiveBits: number | null;
    /** Recent takes whose effective bits are below `specMinEffectiveBits`. */
    lowBitsTakes: number;
    belowFullScaleClipTakes: number;
    rateMismatchTakes: number;
  };
  /** The effective-bits minimum the studio's delivery specs ask for (the strictest of them). */
  specMinEffectiveBits: number;
}

export type AlertKind = 'noise-drift' | 'low-bits' | 'preamp-clipping' | 'rate-mismatch' | 'converter-drift' | 'converter-overdue';

export interface FleetAlert {
  recorderId: number;
  label: string;
  kind: AlertKind;
  severity: 'warn' | 'fail';
  /** A short title and one plain sentence. */
  title: string;
  message: string;
}

const dB = (x: number) => `${x.toFixed(1)} dB`;
const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** The alerts one recorder raises, most serious first. */
export function recorderAlerts(h: RecorderHealth, settings: AlertSettings = DEFAULT_ALERT_SETTINGS): FleetAlert[] {
  const alerts: FleetAlert[] = [];
  const base = { recorderId: h.recorderId, label: h.label };
  const window = `the last ${settings.recentDays} days`;

  const { baseline, recent } = h;
  if (
    baseline.takes >= settings.minBaselineTakes &&
    recent.takes >= settings.minRecentTakes &&
    baseline.medianFloorDbfs !== null &&
    recent.medianFloorDbfs !== null
  ) {
    const rise = recent.medianFloorDbfs - baseline.medianFloorDbfs;
    if (rise > settings.driftDb) {
      alerts.push({
        ...base,
        kind: 'noise-drift',
        severity: rise > 2 * settings.driftDb ? 'fail' : 'warn',
        title: `Noise floor up ${dB(rise)}`,
        message: `The median noise floor of ${window} is ${recent.medianFloorDbfs.toFixed(1)} dBFS, ${dB(rise)} above this recorder’s own baseline of ${baseline.medianFloorDbfs.toFixed(1)} dBFS over the ${settings.baselineDays} days before (alert above ${dB(settings.driftDb)}, a Takeproof default). Check its power supply, cabling and input gain.`,
      });
    }
  }

  if (recent.lowBitsTakes >= settings.lowBitsTakes) {
    alerts.push({
      ...base,
      kind: 'low-bits',
      severity: 'fail',
      title: 'Effective bits below the spec',
      message: `${plural(recent.lowBitsTakes, 'take')} of ${window} used fewer than ${h.specMinEffectiveBits} effective bits (lowest ${recent.minEffectiveBits ?? '—'}), the minimum the studio’s delivery specs ask for. Check the recorder’s bit-depth setting and any 16-bit stage in the chain.`,
    });
  }

  if (recent.belowFullScaleClipTakes >= settings.belowFullScaleTakes) {
    alerts.push({
      ...base,
      kind: 'preamp-clipping',
      severity: 'warn',
      title: 'Repeated clipping below full scale',
      message: `${plural(recent.belowFullScaleClipTakes, 'take')} of ${window} flat-top below 0 dBFS: a preamp or analogue stage is clipping before the converter. Lower the input gain and check the pads.`,
    });
  }

  if (recent.rateMismatchTakes >= settings.rateMismatchTakes) {
    alerts.push({
      ...base,
      kind: 'rate-mismatch',
      severity: 'warn',
      title: 'Declared sample rate does not match the audio',
      message: `${plural(recent.rateMismatchTakes, 'take')} of ${window} sound recorded at another rate than their files declare. Check the recorder’s clock and sample-rate setting.`,
    });
  }

  return alerts.sort((a, b) => (a.severity === b.severity ? 0 : a.severity === 'fail' ? -1 : 1));
}

/** What the converter alerts read of a recorder: its latest converter check and the studio's interval. */
export interface ConverterCheckHealth {
  recorderId: number;
  label: string;
  /** The latest measured check; null when the recorder was never checked (no alert: nothing to compare). */
  latest: { checkId: number; measuredAt: string; drift: string[] } | null;
  intervalDays: number;
}

const DAY_MS = 86_400_000;

/** Whether a recorder's latest converter check is older than the studio's interval. */
export function isCheckOverdue(measuredAt: string, intervalDays: number, now: Date): boolean {
  return now.getTime() - new Date(measuredAt).getTime() > intervalDays * DAY_MS;
}

/**
 * Converter alerts of one recorder: its latest check drifted from its baseline (the engine's
 * judgement, lib/converterChecks), or it is overdue.
 */
export function converterAlerts(h: ConverterCheckHealth, now: Date): FleetAlert[] {
  if (!h.latest) return [];
  const base = { recorderId: h.recorderId, label: h.label };
  const day = h.latest.measuredAt.slice(0, 10);
  const alerts: FleetAlert[] = [];
  if (h.latest.drift.length > 0) {
    const more = h.latest.drift.length - 1;
    alerts.push({
      ...base,
      kind: 'converter-drift',
      severity: 'warn',
      title: 'Converter drifted from its baseline',
      message: `The converter check of ${day} differs from this recorder’s baseline: ${h.latest.drift[0]}${more > 0 ? ` Also ${plural(more, 'other change')}.` : ''} Open the check for the figures.`,
    });
  }
  if (isCheckOverdue(h.latest.measuredAt, h.intervalDays, now)) {
    alerts.push({
      ...base,
      kind: 'converter-overdue',
      severity: 'warn',
      title: 'Converter check overdue',
      message: `The converter was last checked on ${day}, more than the studio’s ${h.intervalDays} days ago. Check it again from the recorder’s converter page.`,
    });
  }
  return alerts;
}
