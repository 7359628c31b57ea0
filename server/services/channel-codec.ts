import { endianness } from 'node:os';
import { promisify } from 'node:util';
import { deflate, inflate } from 'node:zlib';

const deflateAsync = promisify(deflate);
const inflateAsync = promisify(inflate);

/** The one encoding of stored channel data: Float64 values, little-endian, zlib deflate. */
export const CHANNEL_ENCODING = 'f64le+deflate';

const IS_LITTLE_ENDIAN = endianness() === 'LE';

/** The values' bytes in little-endian order (a copy only on a big-endian machine). */
function littleEndianBytes(values: Float64Array): Buffer {
  if (IS_LITTLE_ENDIAN) return Buffer.from(values.buffer, values.byteOffset, values.byteLength);
  const out = Buffer.alloc(values.byteLength);
  values.forEach((v, i) => out.writeDoubleLE(v, i * 8));
  return out;
}

/**
 * Encodes a channel's values for storage (deflate runs on libuv's pool, off the event loop).
 * Level 1: on logged floats the higher levels gain a few percent of size for several times the
 * time, and this runs while the user waits for the log to be ready.
 */
export function encodeChannel(values: Float64Array): Promise<Buffer> {
  return deflateAsync(littleEndianBytes(values), { level: 1 });
}

/** Decodes stored channel data back into its values; throws on an unknown encoding or size. */
export async function decodeChannel(
  data: Buffer,
  encoding: string,
  sampleCount: number,
): Promise<Float64Array> {
  if (encoding !== CHANNEL_ENCODING) throw new Error(`unknown channel encoding "${encoding}"`);
  const bytes = await inflateAsync(data);
  if (bytes.length !== sampleCount * 8) {
    throw new Error(`channel data holds ${bytes.length} bytes, not ${sampleCount} samples`);
  }
  const values = new Float64Array(sampleCount);
  if (IS_LITTLE_ENDIAN) {
    new Uint8Array(values.buffer).set(bytes);
  } else {
    for (let i = 0; i < sampleCount; i++) values[i] = bytes.readDoubleLE(i * 8);
  }
  return values;
}
