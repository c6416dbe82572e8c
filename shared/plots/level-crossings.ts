/**
 * Where a polyline crosses a level of one of its coordinates: for each segment (i, i+1) whose
 * values straddle `level`, the fraction t ∈ [0, 1] along it. A vertex lying exactly on the level
 * counts once (for the segment that starts there); flat segments are skipped.
 */
export function levelCrossings(values: readonly number[], level: number): { i: number; t: number }[] {
  const out: { i: number; t: number }[] = [];
  for (let i = 0; i + 1 < values.length; i++) {
    const a = values[i];
    const b = values[i + 1];
    if ((a - level) * (b - level) > 0 || a === b) continue;
    if (b === level && i + 2 < values.length) continue;
    out.push({ i, t: (level - a) / (b - a) });
  }
  return out;
}
