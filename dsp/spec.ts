import { z } from 'zod';

/**
 * A delivery spec: the thresholds a take is judged against. Every value is a
 * project default unless its comment names a standard; a studio's and a
 * broadcaster's own specs take precedence over these defaults.
 */
export const deliverySpecSchema = z.object({
  name: z.string().trim().min(1, 'Give the spec a name').max(120),
  /** Integrated loudness target, LUFS. EBU R 128: -23 LUFS. */
  loudnessTargetLufs: z.number().min(-40, 'Targets below -40 LUFS are not plausible').max(-5, 'Targets above -5 LUFS are not plausible'),
  /** Allowed distance from the target, LU. EBU R 128: ±0.5 LU for file delivery, ±1 LU for live. */
  loudnessToleranceLu: z.number().min(0.1).max(10),
  /** Whether loudness outside the band fails the take (delivery masters) or only warns (raw takes). */
  loudnessIsStrict: z.boolean(),
  /** Highest allowed true peak, dBTP. EBU R 128: -1 dBTP. */
  maxTruePeakDbtp: z.number().min(-20).max(3),
  /** Fewest bits the data must really use. */
  minEffectiveBits: z.number().int().min(8).max(32),
  /** Highest allowed noise floor of the quiet passages, dBFS RMS. */
  maxNoiseFloorDbfs: z.number().min(-160).max(-20),
  /** Clipping events allowed before the take fails. */
  maxClipEvents: z.number().int().min(0).max(1000),
  /** Largest allowed DC offset, fraction of full scale (0.001 = -60 dBFS). */
  maxDcOffset: z.number().min(0).max(0.5),
  /** Dropouts allowed before the take fails. */
  maxDropouts: z.number().int().min(0).max(1000),
  /** Sample rate the delivery requires, Hz, or null for any. */
  requiredSampleRate: z.number().int().positive().nullable(),
  /** Container bit depth the delivery requires, or null for any. */
  requiredBitDepth: z.union([z.literal(16), z.literal(24), z.literal(32)]).nullable(),
  /** Lowest effective bandwidth before a warning, as a fraction of the declared Nyquist frequency. */
  minBandwidthRatio: z.number().min(0).max(1),
});

export type DeliverySpec = z.infer<typeof deliverySpecSchema>;

/** Built-in defaults for raw studio takes (a project choice, based on EBU R 128 where loudness is concerned). */
export const DEFAULT_SPEC: DeliverySpec = {
  name: 'Takeproof default (studio capture)',
  loudnessTargetLufs: -23,
  loudnessToleranceLu: 1,
  loudnessIsStrict: false,
  maxTruePeakDbtp: -1,
  minEffectiveBits: 20,
  maxNoiseFloorDbfs: -60,
  maxClipEvents: 0,
  maxDcOffset: 0.001,
  maxDropouts: 0,
  requiredSampleRate: null,
  requiredBitDepth: null,
  minBandwidthRatio: 0.8,
};
