/** "x y; x y" in metres, as typed or drawn. */
export function parseCoordinates(text: string): [number, number][] | null {
  const pairs = text.split(/[;\n]+/).map((s) => s.trim()).filter(Boolean).map((s) => s.split(/[\s,]+/).map(Number));
  if (pairs.length === 0 || pairs.some((p) => p.length !== 2 || p.some((v) => !Number.isFinite(v)))) return null;
  return pairs as [number, number][];
}

export const coordinatesText = (pts: readonly [number, number][]) => pts.map(([x, y]) => `${x.toFixed(2)} ${y.toFixed(2)}`).join('; ');
