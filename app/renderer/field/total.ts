/**
 * The total pressure of a duct solution at every dof. The solver launches the incident mode by a
 * total-field / scattered-field split (engine/assembly/injection.ts): upstream of the split plane its
 * unknowns are the scattered (reflected) field only. For a picture of the pressure in the duct the
 * incident mode is added back there, the same wave the solver launched (engine/solve/duct.ts):
 * p_inc = A·cos(mπ(y − y0)/a)·cos(nπ(z − z0)/b)·e^{−j k_x (x − x_in)} inside the inlet's cross-section.
 */
import type { Prepared } from '../../../engine/solve/scenario.ts';
import { modeWavenumber } from '../../../engine/solve/duct.ts';
import type { ComplexVector } from '../../../engine/linalg/sparse.ts';

export function totalField(p: Prepared, frequencyHz: number, u: ComplexVector): ComplexVector {
  if (p.kind !== 'duct') return u;
  const { model, xyz, onTotalSide } = p.duct, { inlet } = model, r = inlet.rect;
  const [m, n] = model.incident.mode, amp = model.incident.amplitude, a = r.y1 - r.y0, b = r.z1 - r.z0;
  const k = (2 * Math.PI * frequencyHz) / model.soundSpeed, kx = modeWavenumber(k, r, m, n);
  if (kx.im !== 0) return u; // an evanescent incident mode was refused by the solver: nothing to add
  const re = Float64Array.from(u.re), im = Float64Array.from(u.im), tol = 1e-9;
  for (let i = 0; i < re.length; i++) {
    if (onTotalSide[i]) continue;
    const x = xyz[3 * i], y = xyz[3 * i + 1], z = xyz[3 * i + 2];
    if (x < inlet.x - tol || y < r.y0 - tol || y > r.y1 + tol || z < r.z0 - tol || z > r.z1 + tol) continue;
    const s = amp * Math.cos((m * Math.PI * (y - r.y0)) / a) * Math.cos((n * Math.PI * (z - r.z0)) / b), ph = -kx.re * (x - inlet.x);
    re[i] += s * Math.cos(ph);
    im[i] += s * Math.sin(ph);
  }
  return { re, im };
}
