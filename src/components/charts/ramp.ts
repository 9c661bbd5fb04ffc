/**
 * The data ramp of src/styles.css (--color-ramp-0 … --color-ramp-8) as numbers, and a lookup table
 * interpolated between its stops in OKLab, so every drawn value gets a colour of the ramp. The
 * stops here must equal the tokens (a client test compares them).
 */
export const RAMP_OKLCH: readonly (readonly [l: number, c: number, h: number])[] = [
  [0.24, 0.06, 265],
  [0.33, 0.08, 255],
  [0.42, 0.09, 235],
  [0.51, 0.09, 210],
  [0.6, 0.1, 185],
  [0.69, 0.11, 160],
  [0.78, 0.12, 130],
  [0.86, 0.12, 105],
  [0.94, 0.1, 95],
];

const srgbByte = (x: number) => {
  const v = x <= 0.0031308 ? 12.92 * x : 1.055 * Math.pow(x, 1 / 2.4) - 0.055;
  return Math.round(Math.min(1, Math.max(0, v)) * 255);
};

/** OKLab (L, a, b) to 8-bit sRGB, clipped to the gamut (Ottosson 2020, "A perceptual color space for image processing"). */
export function oklabToRgb(L: number, a: number, b: number): [number, number, number] {
  const l = (L + 0.3963377774 * a + 0.2158037573 * b) ** 3;
  const m = (L - 0.1055613458 * a - 0.0638541728 * b) ** 3;
  const s = (L - 0.0894841775 * a - 1.291485548 * b) ** 3;
  return [
    srgbByte(4.0767416621 * l - 3.3077115913 * m + 0.2309699292 * s),
    srgbByte(-1.2684380046 * l + 2.6097574011 * m - 0.3413193965 * s),
    srgbByte(-0.0041960863 * l - 0.7034186147 * m + 1.707614701 * s),
  ];
}

export function oklchToRgb(L: number, C: number, hDeg: number): [number, number, number] {
  const h = (hDeg * Math.PI) / 180;
  return oklabToRgb(L, C * Math.cos(h), C * Math.sin(h));
}

/** n colours (RGB bytes, n × 3) from ramp-0 to ramp-8, linear in OKLab between neighbouring stops. */
export function rampTable(n = 256): Uint8ClampedArray {
  const lab = RAMP_OKLCH.map(([l, c, h]) => [l, c * Math.cos((h * Math.PI) / 180), c * Math.sin((h * Math.PI) / 180)] as const);
  const out = new Uint8ClampedArray(n * 3);
  const segments = lab.length - 1;
  for (let i = 0; i < n; i++) {
    const x = (i / (n - 1)) * segments;
    const k = Math.min(segments - 1, Math.floor(x));
    const w = x - k;
    const a = lab[k]!;
    const b = lab[k + 1]!;
    const [r, g, bl] = oklabToRgb(a[0] + w * (b[0] - a[0]), a[1] + w * (b[1] - a[1]), a[2] + w * (b[2] - a[2]));
    out[i * 3] = r;
    out[i * 3 + 1] = g;
    out[i * 3 + 2] = bl;
  }
  return out;
}

/** The table entry for t in [0, 1] as a CSS colour. */
export function rampCss(table: Uint8ClampedArray, t: number): string {
  const n = table.length / 3;
  const i = Math.round(Math.min(1, Math.max(0, t)) * (n - 1));
  return `rgb(${table[i * 3]} ${table[i * 3 + 1]} ${table[i * 3 + 2]})`;
}
