/**
 * Numerical integration on a finite interval.
 *
 * - `gaussLegendre(n)`: the n-point Gauss-Legendre rule on [-1, 1], nodes by
 *   Newton's method on P_n (exact for polynomials of degree 2n - 1). Fixed
 *   rules serve inner loops that run millions of times.
 * - `integrateAdaptive`: globally adaptive Gauss-Kronrod (7-point Gauss,
 *   15-point Kronrod, the QUADPACK QK15 pair). The interval with the largest
 *   error estimate is bisected until the summed estimate meets the tolerance;
 *   the result reports whether it did.
 */

export interface GaussRule {
  readonly nodes: Float64Array;
  readonly weights: Float64Array;
}

const ruleCache = new Map<number, GaussRule>();

/** The n-point Gauss-Legendre rule on [-1, 1] (nodes ascending). */
export function gaussLegendre(n: number): GaussRule {
  if (!Number.isInteger(n) || n < 1 || n > 1000) throw new RangeError(`Gauss-Legendre order must be 1..1000 (got ${n})`);
  const cached = ruleCache.get(n);
  if (cached) return cached;
  const nodes = new Float64Array(n);
  const weights = new Float64Array(n);
  const half = Math.floor((n + 1) / 2);
  for (let i = 0; i < half; i++) {
    // Tricomi's asymptotic guess is close enough for Newton to converge quadratically.
    let x = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
    let derivative = 1;
    for (let iteration = 0; iteration < 100; iteration++) {
      let p0 = 1;
      let p1 = x;
      for (let k = 2; k <= n; k++) {
        const p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
        p0 = p1;
        p1 = p2;
      }
      derivative = (n * (x * p1 - p0)) / (x * x - 1);
      const step = p1 / derivative;
      x -= step;
      if (Math.abs(step) <= 1e-16 * Math.max(1, Math.abs(x))) break;
    }
    // Recompute the derivative at the converged node for the weight.
    let p0 = 1;
    let p1 = x;
    for (let k = 2; k <= n; k++) {
      const p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
      p0 = p1;
      p1 = p2;
    }
    derivative = (n * (x * p1 - p0)) / (x * x - 1);
    const w = 2 / ((1 - x * x) * derivative * derivative);
    nodes[i] = -x;
    nodes[n - 1 - i] = x;
    weights[i] = w;
    weights[n - 1 - i] = w;
  }
  if (n % 2 === 1) nodes[(n - 1) / 2] = 0;
  const rule = { nodes, weights };
  ruleCache.set(n, rule);
  return rule;
}

/** Integral of f over [a, b] by the n-point Gauss-Legendre rule. */
export function integrateGauss(f: (x: number) => number, a: number, b: number, n = 20): number {
  const { nodes, weights } = gaussLegendre(n);
  const mid = 0.5 * (a + b);
  const half = 0.5 * (b - a);
  let sum = 0;
  for (let i = 0; i < n; i++) sum += weights[i] * f(mid + half * nodes[i]);
  return sum * half;
}

// QUADPACK QK15: Kronrod abscissae (positive half, descending; odd indices are the Gauss points).
const XGK = [
  0.991455371120812639206854697526329, 0.949107912342758524526189684047851, 0.864864423359769072789712788640926,
  0.741531185599394439863864773280788, 0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
  0.207784955007898467600689403773245, 0,
];
const WGK = [
  0.02293532201052922496373200805897, 0.063092092629978553290700663189204, 0.104790010322250183839876322541518,
  0.140653259715525918745189590510238, 0.16900472663926790282658342659855, 0.190350578064785409913256402421014,
  0.204432940075298892414161999234649, 0.209482141084727828012999174891714,
];
const WG = [
  0.129484966168869693270611432679082, 0.27970539148927666790146777142378, 0.381830050505118944950369775488975,
  0.417959183673469387755102040816327,
];

interface Piece {
  a: number;
  b: number;
  value: number;
  error: number;
}

function kronrod15(f: (x: number) => number, a: number, b: number): Piece {
  const center = 0.5 * (a + b);
  const half = 0.5 * (b - a);
  const fc = f(center);
  let kronrod = WGK[7] * fc;
  let gauss = WG[3] * fc;
  for (let j = 0; j < 7; j++) {
    const dx = half * XGK[j];
    const pair = f(center - dx) + f(center + dx);
    kronrod += WGK[j] * pair;
    if (j % 2 === 1) gauss += WG[(j - 1) / 2] * pair;
  }
  return { a, b, value: kronrod * half, error: Math.abs((kronrod - gauss) * half) };
}

export interface QuadratureOptions {
  /** Stop when the error estimate is below relativeTolerance * |integral| ... */
  relativeTolerance?: number;
  /** ... or below this absolute bound. */
  absoluteTolerance?: number;
  /** Most subintervals before giving up (the result then reports converged: false). */
  maxIntervals?: number;
  /** Interior points where f has a kink or steep change: start with them as interval ends. */
  breakpoints?: readonly number[];
}

export interface QuadratureResult {
  value: number;
  errorEstimate: number;
  converged: boolean;
  intervals: number;
  evaluations: number;
}

/**
 * Globally adaptive Gauss-Kronrod (G7/K15) integral of f over [a, b]. The
 * error estimate |K15 - G7| is the Gauss rule's error, so it overstates the
 * Kronrod result's error for smooth f: a safe stopping test.
 */
export function integrateAdaptive(
  f: (x: number) => number,
  a: number,
  b: number,
  { relativeTolerance = 1e-10, absoluteTolerance = 0, maxIntervals = 2000, breakpoints = [] }: QuadratureOptions = {},
): QuadratureResult {
  if (!(Number.isFinite(a) && Number.isFinite(b))) throw new RangeError("integration limits must be finite");
  if (a === b) return { value: 0, errorEstimate: 0, converged: true, intervals: 0, evaluations: 0 };
  const sign = b > a ? 1 : -1;
  const lo = Math.min(a, b);
  const hi = Math.max(a, b);
  const ends = [lo, ...breakpoints.filter((x) => x > lo && x < hi).sort((x, y) => x - y), hi];
  const heap: Piece[] = [];
  let evaluations = 0;
  for (let i = 0; i + 1 < ends.length; i++) {
    if (ends[i + 1] > ends[i]) {
      heapPush(heap, kronrod15(f, ends[i], ends[i + 1]));
      evaluations += 15;
    }
  }
  let value = 0;
  let error = 0;
  for (const p of heap) {
    value += p.value;
    error += p.error;
  }
  while (error > Math.max(absoluteTolerance, relativeTolerance * Math.abs(value)) && heap.length < maxIntervals) {
    const worst = heapPop(heap);
    const mid = 0.5 * (worst.a + worst.b);
    // Below this width the interval cannot be split in floating point.
    if (!(mid > worst.a && mid < worst.b)) {
      heapPush(heap, { ...worst, error: 0 });
      break;
    }
    const left = kronrod15(f, worst.a, mid);
    const right = kronrod15(f, mid, worst.b);
    evaluations += 30;
    heapPush(heap, left);
    heapPush(heap, right);
    // Re-summing keeps drift from thousands of updates out of the totals.
    value = 0;
    error = 0;
    for (const p of heap) {
      value += p.value;
      error += p.error;
    }
  }
  const converged = error <= Math.max(absoluteTolerance, relativeTolerance * Math.abs(value));
  return { value: sign * value, errorEstimate: error, converged, intervals: heap.length, evaluations };
}

// A max-heap on error: the worst interval is always at the root.
function heapPush(heap: Piece[], piece: Piece): void {
  heap.push(piece);
  let i = heap.length - 1;
  while (i > 0) {
    const parent = (i - 1) >> 1;
    if (heap[parent].error >= heap[i].error) break;
    [heap[parent], heap[i]] = [heap[i], heap[parent]];
    i = parent;
  }
}

function heapPop(heap: Piece[]): Piece {
  const top = heap[0];
  const last = heap.pop() as Piece;
  if (heap.length > 0) {
    heap[0] = last;
    let i = 0;
    for (;;) {
      const l = 2 * i + 1;
      const r = l + 1;
      let largest = i;
      if (l < heap.length && heap[l].error > heap[largest].error) largest = l;
      if (r < heap.length && heap[r].error > heap[largest].error) largest = r;
      if (largest === i) break;
      [heap[largest], heap[i]] = [heap[i], heap[largest]];
      i = largest;
    }
  }
  return top;
}
