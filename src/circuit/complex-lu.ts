/** Dense complex LU with partial pivoting (real and imaginary parts in separate arrays). */
import { SingularMatrixError } from './errors.js';

export function solveComplexDense(
  n: number,
  aRe: Float64Array,
  aIm: Float64Array,
  bRe: Float64Array,
  bIm: Float64Array,
): { re: Float64Array; im: Float64Array } {
  const re = aRe.slice();
  const im = aIm.slice();
  const xr = bRe.slice();
  const xi = bIm.slice();
  for (let k = 0; k < n; k++) {
    let p = k;
    let best = Math.hypot(re[k * n + k], im[k * n + k]);
    for (let i = k + 1; i < n; i++) {
      const v = Math.hypot(re[i * n + k], im[i * n + k]);
      if (v > best) {
        best = v;
        p = i;
      }
    }
    if (!(best > 1e-300)) throw new SingularMatrixError(k);
    if (p !== k) {
      for (let j = 0; j < n; j++) {
        const a = k * n + j;
        const b = p * n + j;
        let t = re[a]; re[a] = re[b]; re[b] = t;
        t = im[a]; im[a] = im[b]; im[b] = t;
      }
      let t = xr[k]; xr[k] = xr[p]; xr[p] = t;
      t = xi[k]; xi[k] = xi[p]; xi[p] = t;
    }
    const pr = re[k * n + k];
    const pi = im[k * n + k];
    const d = pr * pr + pi * pi;
    for (let i = k + 1; i < n; i++) {
      const ar = re[i * n + k];
      const ai = im[i * n + k];
      if (ar === 0 && ai === 0) continue;
      // f = a[i][k] / pivot
      const fr = (ar * pr + ai * pi) / d;
      const fi = (ai * pr - ar * pi) / d;
      for (let j = k + 1; j < n; j++) {
        const ur = re[k * n + j];
        const ui = im[k * n + j];
        if (ur === 0 && ui === 0) continue;
        re[i * n + j] -= fr * ur - fi * ui;
        im[i * n + j] -= fr * ui + fi * ur;
      }
      xr[i] -= fr * xr[k] - fi * xi[k];
      xi[i] -= fr * xi[k] + fi * xr[k];
    }
  }
  for (let i = n - 1; i >= 0; i--) {
    let sr = xr[i];
    let si = xi[i];
    for (let j = i + 1; j < n; j++) {
      const ar = re[i * n + j];
      const ai = im[i * n + j];
      sr -= ar * xr[j] - ai * xi[j];
      si -= ar * xi[j] + ai * xr[j];
    }
    const pr = re[i * n + i];
    const pi = im[i * n + i];
    const d = pr * pr + pi * pi;
    xr[i] = (sr * pr + si * pi) / d;
    xi[i] = (si * pr - sr * pi) / d;
  }
  return { re: xr, im: xi };
}
