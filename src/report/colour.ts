/**
 * Colour ramps for the report: 256-entry palettes for PNG images and CSS
 * colours for SVG. Piecewise-linear interpolation between a few hand-chosen
 * stops (our own choice; ordered in lightness so they print in grey too).
 */

export type Rgb = readonly [number, number, number];

/** Stops of the density ramp: empty → sparse → dense. */
export const DENSITY_STOPS: readonly Rgb[] = [[140, 178, 228], [74, 130, 205], [37, 87, 163], [13, 33, 84]];
/** Stops of the factor ramp (warm, so L is told apart from A at a glance). */
export const FACTOR_STOPS: readonly Rgb[] = [[248, 180, 128], [240, 135, 62], [196, 72, 27], [105, 28, 12]];
/** Stops of the temperature ramp: cool → hot. */
export const HEAT_STOPS: readonly Rgb[] = [
  [32, 44, 110], [36, 110, 178], [52, 170, 170], [170, 214, 92], [250, 200, 60], [240, 120, 40], [180, 30, 40],
];

/** Colour at t ∈ [0, 1] along the stops. */
export function ramp(stops: readonly Rgb[], t: number): Rgb {
  const x = Math.min(1, Math.max(0, t)) * (stops.length - 1);
  const i = Math.min(stops.length - 2, Math.floor(x));
  const f = x - i;
  const a = stops[i], b = stops[i + 1];
  return [Math.round(a[0] + f * (b[0] - a[0])), Math.round(a[1] + f * (b[1] - a[1])), Math.round(a[2] + f * (b[2] - a[2]))];
}

/** CSS hex of a colour. */
export function hex(c: Rgb): string {
  return `#${c.map((v) => v.toString(16).padStart(2, "0")).join("")}`;
}

/**
 * 256-entry palette: entry 0 is the background, entries 1..255 run along the
 * stops.
 */
export function palette(stops: readonly Rgb[], background: Rgb = [255, 255, 255]): Uint8Array {
  const p = new Uint8Array(768);
  p.set(background, 0);
  for (let i = 1; i < 256; i++) p.set(ramp(stops, (i - 1) / 254), 3 * i);
  return p;
}
