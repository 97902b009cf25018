/**
 * The demo scenario (illustrative, invented data): steady heat conduction in a
 * thin aluminium cooling plate under a battery module. Cells deposit heat in
 * rectangular patches, coolant channels (circular holes through the plate)
 * hold a fixed temperature, the outer rim is insulated. In the plate's plane
 *   −∇·(k t ∇T) = q(x, y)   [W/m²],   T = T_coolant on the channels,
 * with k the conductivity and t the thickness.
 */
import type { Hole, PlateSpec } from "./mesh.js";

/** Invented but plausible numbers; nothing here describes a real product. */
export const BATTERY_PLATE = {
  width: 0.36, // m
  height: 0.24, // m
  thickness: 0.004, // m
  conductivity: 167, // W/(m·K), a common aluminium alloy (from memory)
  coolantTemperature: 25, // °C
  /** cells: 4 × 2 patches, each 0.07 m × 0.09 m, with per-cell heat in W */
  cells: [
    { x: 0.02, y: 0.02, w: 0.07, h: 0.09, watts: 6 }, { x: 0.105, y: 0.02, w: 0.07, h: 0.09, watts: 7 },
    { x: 0.19, y: 0.02, w: 0.07, h: 0.09, watts: 7 }, { x: 0.275, y: 0.02, w: 0.07, h: 0.09, watts: 9 },
    { x: 0.02, y: 0.13, w: 0.07, h: 0.09, watts: 6 }, { x: 0.105, y: 0.13, w: 0.07, h: 0.09, watts: 8 },
    { x: 0.19, y: 0.13, w: 0.07, h: 0.09, watts: 7 }, { x: 0.275, y: 0.13, w: 0.07, h: 0.09, watts: 12 },
  ],
  /** coolant channels between the cell rows and columns */
  channels: [
    { x: 0.0975, y: 0.12, r: 0.009 }, { x: 0.1825, y: 0.12, r: 0.009 }, { x: 0.2675, y: 0.12, r: 0.009 },
    { x: 0.0975, y: 0.045, r: 0.006 }, { x: 0.2675, y: 0.195, r: 0.006 },
  ] as Hole[],
} as const;

/** The plate geometry at mesh spacing h (metres). */
export function batteryPlate(h: number): PlateSpec {
  return { width: BATTERY_PLATE.width, height: BATTERY_PLATE.height, holes: BATTERY_PLATE.channels, h };
}

/** Heat flux density q(x, y) in W/m²: each cell's power spread uniformly over its patch. */
export function batteryHeat(x: number, y: number): number {
  for (const c of BATTERY_PLATE.cells) {
    if (x >= c.x && x <= c.x + c.w && y >= c.y && y <= c.y + c.h) return c.watts / (c.w * c.h);
  }
  return 0;
}
