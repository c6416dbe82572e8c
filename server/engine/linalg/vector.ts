/** Small dense vector helpers over Float64Array. */
export function dot(a: ArrayLike<number>, b: ArrayLike<number>, n = a.length): number {
  let s = 0;
  for (let i = 0; i < n; i++) s += a[i] * b[i];
  return s;
}

/** Euclidean norm, scaled to avoid overflow. */
export function norm2(a: ArrayLike<number>, n = a.length): number {
  let scale = 0;
  for (let i = 0; i < n; i++) scale = Math.max(scale, Math.abs(a[i]));
  if (scale === 0 || !Number.isFinite(scale)) return scale;
  let s = 0;
  for (let i = 0; i < n; i++) {
    const t = a[i] / scale;
    s += t * t;
  }
  return scale * Math.sqrt(s);
}

export function normInf(a: ArrayLike<number>, n = a.length): number {
  let m = 0;
  for (let i = 0; i < n; i++) {
    const v = Math.abs(a[i]);
    if (v > m || Number.isNaN(v)) m = v;
  }
  return m;
}

/** y = A·x for a row-major n×m matrix. */
export function matVec(a: Float64Array, x: ArrayLike<number>, n: number, m: number, out: Float64Array = new Float64Array(n)): Float64Array {
  for (let i = 0; i < n; i++) {
    let s = 0;
    const r = i * m;
    for (let j = 0; j < m; j++) s += a[r + j] * x[j];
    out[i] = s;
  }
  return out;
}

/** y = Aᵀ·x for a row-major n×m matrix (result has m entries). */
export function matTVec(a: Float64Array, x: ArrayLike<number>, n: number, m: number, out: Float64Array = new Float64Array(m)): Float64Array {
  out.fill(0, 0, m);
  for (let i = 0; i < n; i++) {
    const xi = x[i];
    const r = i * m;
    for (let j = 0; j < m; j++) out[j] += a[r + j] * xi;
  }
  return out;
}

export function allFinite(a: ArrayLike<number>, n = a.length): boolean {
  for (let i = 0; i < n; i++) if (!Number.isFinite(a[i])) return false;
  return true;
}
