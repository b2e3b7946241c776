/**
 * The principal branch of the Lambert W function, W(x)·e^W(x) = x, for the closed-form diode
 * checks. Written from its definition (Halley's iteration on w·e^w − x); for the huge arguments a
 * diode produces it works in log space, solving w + ln w = ln x.
 */
export function lambertW(x: number): number {
  if (!(x >= 0)) throw new RangeError('lambertW here is for x ≥ 0');
  if (x === 0) return 0;
  if (x > 1e100 || !Number.isFinite(x)) return lambertWOfExp(Math.log(x));
  let w = x < 1 ? x * (1 - x) : Math.log(x) - Math.log(Math.log(x) + 1);
  if (!(w > 0)) w = 0.5;
  for (let i = 0; i < 60; i++) {
    const ew = Math.exp(w);
    const f = w * ew - x;
    const wNext = w - f / (ew * (w + 1) - ((w + 2) * f) / (2 * w + 2));
    if (Math.abs(wNext - w) <= 1e-15 * Math.max(1, Math.abs(wNext))) return wNext;
    w = wNext;
  }
  return w;
}

/** W(e^lnx) for lnx large: Newton on g(w) = w + ln w − lnx. */
export function lambertWOfExp(lnx: number): number {
  let w = lnx > 1 ? lnx - Math.log(lnx) : 1;
  for (let i = 0; i < 60; i++) {
    const g = w + Math.log(w) - lnx;
    const wNext = w - g / (1 + 1 / w);
    if (Math.abs(wNext - w) <= 1e-15 * Math.abs(wNext)) return wNext;
    w = wNext;
  }
  return w;
}
