// Unit conversions at the edges; the core works in lux.

/** 1 fc = 1 lm/ft^2 = 1 / 0.3048^2 lx (exact: the international foot is 0.3048 m). */
export const LUX_PER_FOOTCANDLE = 1 / 0.3048 ** 2;

/** fc = lx / LUX_PER_FOOTCANDLE */
export function luxToFootcandles(lux: number): number {
  return lux / LUX_PER_FOOTCANDLE;
}

/** lx = fc * LUX_PER_FOOTCANDLE */
export function footcandlesToLux(fc: number): number {
  return fc * LUX_PER_FOOTCANDLE;
}
