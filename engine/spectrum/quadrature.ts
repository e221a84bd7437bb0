/**
 * Globally adaptive Gauss–Kronrod quadrature (7-point Gauss, 15-point Kronrod), the scheme of
 * QUADPACK's QAG (Piessens, de Doncker-Kapenga, Überhuber & Kahaner, QUADPACK, Springer 1983): the
 * interval with the largest error estimate |K15 − G7| is halved until the sum of the estimates meets
 * the tolerance. Callers pass breakpoints (e.g. the real parts of poles near the interval) so that a
 * sharp resonance starts on an interval edge instead of being hunted for.
 */

// Kronrod nodes on [0, 1) of the symmetric rule (node 7 is the centre); odd entries are the Gauss nodes.
const XK = [
  0.991455371120812639206854697526329, 0.949107912342758524526189684047851, 0.864864423359769072789712788640926,
  0.741531185599394439863864773280788, 0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
  0.207784955007898467600689403773245, 0,
];
const WK = [
  0.022935322010529224963732008058970, 0.063092092629978553290700663189204, 0.104790010322250183839876322541518,
  0.140653259715525918745189590510238, 0.169004726639267902826583426598550, 0.190350578064785409913256402421014,
  0.204432940075298892414161999234649, 0.209482141084727828012999174891714,
];
// Gauss weights of the nodes XK[1], XK[3], XK[5], XK[7].
const WG = [0.129484966168869693270611432679082, 0.279705391489276667901467771423780, 0.381830050505118944950369775488975, 0.417959183673469387755102040816327];

export interface QuadratureResult {
  value: number;
  /** Sum of the intervals' |K15 − G7|: a (usually pessimistic) bound on the error. */
  error: number;
  evaluations: number;
  /** False when the interval budget ran out before the tolerance was met. */
  converged: boolean;
}

export interface QuadratureOptions {
  relativeTolerance?: number; // default 1e-10
  absoluteTolerance?: number; // default 0
  maxIntervals?: number; // default 400
  breakpoints?: readonly number[];
}

interface Piece { a: number; b: number; value: number; error: number }

/** One 15-point rule on [a, b]. */
export function kronrod15(f: (x: number) => number, a: number, b: number): { value: number; error: number } {
  const c = 0.5 * (a + b), h = 0.5 * (b - a);
  const fc = f(c);
  let k = WK[7] * fc, g = WG[3] * fc;
  for (let i = 0; i < 7; i++) {
    const dx = h * XK[i], s = f(c - dx) + f(c + dx);
    k += WK[i] * s;
    if (i % 2 === 1) g += WG[(i - 1) / 2] * s;
  }
  return { value: k * h, error: Math.abs((k - g) * h) };
}

export function integrate(f: (x: number) => number, a: number, b: number, options: QuadratureOptions = {}): QuadratureResult {
  const rel = options.relativeTolerance ?? 1e-10, abs = options.absoluteTolerance ?? 0, maxIntervals = options.maxIntervals ?? 400;
  if (!(b > a)) return { value: 0, error: 0, evaluations: 0, converged: true };
  const cuts = [a, ...[...(options.breakpoints ?? [])].filter((x) => x > a && x < b).sort((x, y) => x - y), b];
  const pieces: Piece[] = [];
  let evaluations = 0;
  for (let i = 0; i + 1 < cuts.length; i++) {
    if (!(cuts[i + 1] > cuts[i])) continue;
    pieces.push({ a: cuts[i], b: cuts[i + 1], ...kronrod15(f, cuts[i], cuts[i + 1]) });
    evaluations += 15;
  }
  const total = () => pieces.reduce((s, p) => s + p.value, 0);
  const totalError = () => pieces.reduce((s, p) => s + p.error, 0);
  while (totalError() > Math.max(abs, rel * Math.abs(total())) && pieces.length < maxIntervals) {
    let worst = 0;
    for (let i = 1; i < pieces.length; i++) if (pieces[i].error > pieces[worst].error) worst = i;
    const p = pieces[worst], m = 0.5 * (p.a + p.b);
    if (!(m > p.a && m < p.b)) break; // the interval cannot be halved in floating point
    pieces.splice(worst, 1, { a: p.a, b: m, ...kronrod15(f, p.a, m) }, { a: m, b: p.b, ...kronrod15(f, m, p.b) });
    evaluations += 30;
  }
  const value = total(), error = totalError();
  return { value, error, evaluations, converged: error <= Math.max(abs, rel * Math.abs(value)) };
}
