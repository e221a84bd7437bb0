/**
 * One-dimensional quadrature rules on the reference interval [−1, 1].
 * Nodes by Newton iteration on Legendre polynomials (Golub & Welsch give the same rules through
 * an eigenproblem; Newton from Chebyshev guesses converges in a few steps and needs no linear algebra).
 * Source: Abramowitz & Stegun, Handbook of Mathematical Functions (1964), 25.4.29 (Gauss) and 25.4.32 (Lobatto).
 */
export interface Rule {
  points: Float64Array; // n, ascending in [−1, 1]
  weights: Float64Array; // n
}

/** P_n(x) and P_n'(x) by the three-term recurrence. */
export function legendre(n: number, x: number): { value: number; slope: number } {
  if (n === 0) return { value: 1, slope: 0 };
  let p0 = 1, p1 = x;
  for (let k = 2; k <= n; k++) {
    const p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
    p0 = p1;
    p1 = p2;
  }
  // P_n' from P_n and P_{n−1}; at x = ±1 use the closed form n(n+1)/2·(±1)^{n+1}.
  const slope = Math.abs(x) === 1 ? 0.5 * n * (n + 1) * Math.pow(x, n + 1) : (n * (x * p1 - p0)) / (x * x - 1);
  return { value: p1, slope };
}

const cache = new Map<string, Rule>();

function memo(key: string, make: () => Rule): Rule {
  let r = cache.get(key);
  if (!r) cache.set(key, (r = make()));
  return r;
}

/** n-point Gauss–Legendre rule: exact for polynomials of degree 2n − 1. */
export function gaussLegendre(n: number): Rule {
  if (!(n >= 1 && Number.isInteger(n))) throw new RangeError(`gaussLegendre: n must be a positive integer, got ${n}`);
  return memo(`G${n}`, () => {
    const points = new Float64Array(n), weights = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      let x = -Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
      for (let it = 0; it < 100; it++) {
        const { value, slope } = legendre(n, x);
        const dx = value / slope;
        x -= dx;
        if (Math.abs(dx) < 1e-16) break;
      }
      const { slope } = legendre(n, x);
      points[i] = x;
      weights[i] = 2 / ((1 - x * x) * slope * slope);
    }
    return { points, weights };
  });
}

/** n-point Gauss–Lobatto–Legendre rule (n ≥ 2): endpoints included, exact for degree 2n − 3. */
export function gaussLobatto(n: number): Rule {
  if (!(n >= 2 && Number.isInteger(n))) throw new RangeError(`gaussLobatto: n must be an integer ≥ 2, got ${n}`);
  return memo(`L${n}`, () => {
    const m = n - 1;
    const points = new Float64Array(n), weights = new Float64Array(n);
    points[0] = -1;
    points[m] = 1;
    // Interior nodes are the roots of P_m'; Newton on P_m' with P_m'' from the Legendre ODE.
    for (let i = 1; i < m; i++) {
      let x = -Math.cos((Math.PI * i) / m);
      for (let it = 0; it < 100; it++) {
        const { value, slope } = legendre(m, x);
        const second = (2 * x * slope - m * (m + 1) * value) / (1 - x * x);
        const dx = slope / second;
        x -= dx;
        if (Math.abs(dx) < 1e-16) break;
      }
      points[i] = x;
    }
    for (let i = 0; i < n; i++) {
      const { value } = legendre(m, points[i]);
      weights[i] = 2 / (m * (m + 1) * value * value);
    }
    return { points, weights };
  });
}
