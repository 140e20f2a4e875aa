/** Display helpers shared by pages, tables and reports. Numbers keep their units beside them. */
export function formatDuration(seconds: number | null): string {
  if (seconds == null) return '—';
  const s = Math.round(seconds);
  const h = Math.floor(s / 3600);
  const m = Math.floor((s % 3600) / 60);
  const rest = String(s % 60).padStart(2, '0');
  return h ? `${h}:${String(m).padStart(2, '0')}:${rest}` : `${m}:${rest}`;
}

export function formatNumber(value: number | null | undefined, decimals = 1, unit = ''): string {
  if (value == null || !Number.isFinite(value)) return '—';
  return `${value.toFixed(decimals)}${unit ? ` ${unit}` : ''}`;
}

export function formatFormat(f: { sampleRate: number | null; bitsPerSample: number | null; channels: number | null; encoding: string | null }): string {
  if (!f.sampleRate) return '—';
  const rate = `${(f.sampleRate / 1000).toFixed(f.sampleRate % 1000 ? 1 : 0)} kHz`;
  const bits = `${f.bitsPerSample}-bit${f.encoding === 'float' ? ' float' : ''}`;
  const ch = f.channels === 1 ? 'mono' : f.channels === 2 ? 'stereo' : `${f.channels} ch`;
  return `${rate} · ${bits} · ${ch}`;
}

export function formatBytes(n: number): string {
  if (n >= 1024 ** 3) return `${(n / 1024 ** 3).toFixed(2)} GB`;
  if (n >= 1024 ** 2) return `${(n / 1024 ** 2).toFixed(1)} MB`;
  if (n >= 1024) return `${Math.round(n / 1024)} KB`;
  return `${n} B`;
}

/** Removes control characters and caps the length; a take's name is only ever shown, never used as a path. */
export function cleanFileName(name: string): string {
  // eslint-disable-next-line no-control-regex
  const cleaned = name.replace(/[\u0000-\u001f\u007f-\u009f]/g, '').trim();
  return (cleaned || 'unnamed.wav').slice(0, 512);
}
