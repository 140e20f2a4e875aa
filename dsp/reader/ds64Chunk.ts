/** Sizes carried by the RF64 `ds64` chunk (EBU Tech 3306), which replace 32-bit fields set to 0xFFFFFFFF. */
export interface Ds64Sizes {
  riffBytes: number;
  dataBytes: number;
  sampleCount: number;
  /** 64-bit sizes of other chunks, by chunk id. */
  chunkBytes: Map<string, number>;
}

const read64 = (body: Buffer, offset: number) => body.readUInt32LE(offset) + body.readUInt32LE(offset + 4) * 2 ** 32;

/** Parses a `ds64` body: riff, data and sample-count 64-bit sizes, then a table of {id, size64}. Returns null when shorter than 28 bytes. */
export function parseDs64Chunk(body: Buffer): Ds64Sizes | null {
  if (body.length < 28) return null;
  const chunkBytes = new Map<string, number>();
  const tableLength = body.readUInt32LE(24);
  for (let entry = 0; entry < tableLength && 28 + entry * 12 + 12 <= body.length; entry++) {
    const at = 28 + entry * 12;
    chunkBytes.set(body.toString('latin1', at, at + 4), read64(body, at + 4));
  }
  return { riffBytes: read64(body, 0), dataBytes: read64(body, 8), sampleCount: read64(body, 16), chunkBytes };
}
