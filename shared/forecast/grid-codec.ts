import type { ForecastGrid } from './grid.ts';

/**
 * Binary form of a ForecastGrid, used for storage and for the API (application/octet-stream):
 *   "PTG1" | uint32 LE header length | header JSON (UTF-8) | zero padding to 8 bytes |
 *   depthM f64[nz] | thicknessM f64[nz] | depthMeanAlong f64[nt] | depthMeanSpeed f64[nt] |
 *   bedStressPa f64[nt] | concentration f32[nt·nz] | speed f32[nt·nz] | diffusivity f32[nt·nz]
 * Typed arrays are little-endian, as on every platform Planktide runs on.
 */
const MAGIC = [0x50, 0x54, 0x47, 0x31];

interface Header {
  startMs: number;
  stepMs: number;
  nt: number;
  nz: number;
  waterDepthM: number;
}

export function encodeGrid(grid: ForecastGrid): Uint8Array {
  const header: Header = { startMs: grid.startMs, stepMs: grid.stepMs, nt: grid.nt, nz: grid.nz, waterDepthM: grid.waterDepthM };
  const json = new TextEncoder().encode(JSON.stringify(header));
  const headerEnd = Math.ceil((8 + json.length) / 8) * 8;
  const f64 = 2 * grid.nz + 3 * grid.nt;
  const f32 = 3 * grid.nt * grid.nz;
  const bytes = new Uint8Array(headerEnd + f64 * 8 + f32 * 4);
  bytes.set(MAGIC, 0);
  new DataView(bytes.buffer).setUint32(4, json.length, true);
  bytes.set(json, 8);
  let offset = headerEnd;
  for (const array of [grid.depthM, grid.thicknessM, grid.depthMeanAlong, grid.depthMeanSpeed, grid.bedStressPa, grid.concentration, grid.speed, grid.diffusivity]) {
    bytes.set(new Uint8Array(array.buffer, array.byteOffset, array.byteLength), offset);
    offset += array.byteLength;
  }
  return bytes;
}

export class GridFormatError extends Error {}

export function decodeGrid(input: ArrayBuffer | Uint8Array): ForecastGrid {
  const bytes = input instanceof Uint8Array ? input : new Uint8Array(input);
  if (bytes.length < 8 || MAGIC.some((b, i) => bytes[i] !== b)) throw new GridFormatError('Not a Planktide grid (bad magic number).');
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const headerLength = view.getUint32(4, true);
  const header = JSON.parse(new TextDecoder().decode(bytes.subarray(8, 8 + headerLength))) as Header;
  const { nt, nz } = header;
  const headerEnd = Math.ceil((8 + headerLength) / 8) * 8;
  const expected = headerEnd + (2 * nz + 3 * nt) * 8 + 3 * nt * nz * 4;
  if (bytes.length !== expected) throw new GridFormatError(`Grid is ${bytes.length} bytes; its header asks for ${expected}.`);
  // Copy into a fresh, aligned buffer so typed-array views are valid whatever the input's offset
  // (a Node Buffer is a view into a larger pool: its slice() would not copy).
  const body = new Uint8Array(bytes.subarray(headerEnd)).buffer;
  let offset = 0;
  const f64 = (n: number) => {
    const a = new Float64Array(body, offset, n);
    offset += n * 8;
    return a;
  };
  const f32 = (n: number) => {
    const a = new Float32Array(body, offset, n);
    offset += n * 4;
    return a;
  };
  return {
    ...header,
    depthM: f64(nz),
    thicknessM: f64(nz),
    depthMeanAlong: f64(nt),
    depthMeanSpeed: f64(nt),
    bedStressPa: f64(nt),
    concentration: f32(nt * nz),
    speed: f32(nt * nz),
    diffusivity: f32(nt * nz),
  };
}
