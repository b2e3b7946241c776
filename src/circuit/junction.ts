/**
 * Pure pn-junction maths shared by the diode and the bipolar transistor, following the SPICE
 * device equations: Shockley's law forward and for small reverse bias, a smooth cubic approach
 * to −Is for deep reverse bias (it keeps the conductance positive and avoids exp underflow),
 * and the SPICE voltage-step limit that stops Newton from overshooting an exponential.
 */

/** exp() that continues linearly above 80 so an extreme Newton iterate never produces Infinity. */
export function safeExp(x: number): number {
  if (x <= 80) return Math.exp(x);
  const e80 = 5.540622384393510e34;
  return e80 * (1 + (x - 80));
}

/** d/dx of safeExp. */
export function safeExpSlope(x: number): number {
  return x <= 80 ? Math.exp(x) : 5.540622384393510e34;
}

/**
 * Junction current and conductance: out[0] = i, out[1] = di/dv.
 * For v ≥ −3·nVt: i = Is·(exp(v/nVt) − 1); below, SPICE's −Is·(1 + (3nVt/(e·v))³).
 */
export function junction(v: number, is: number, nvt: number, out: Float64Array): void {
  if (v >= -3 * nvt) {
    const e = safeExp(v / nvt);
    out[0] = is * (e - 1);
    out[1] = (is * safeExpSlope(v / nvt)) / nvt;
  } else {
    let arg = (3 * nvt) / (v * Math.E);
    arg = arg * arg * arg;
    out[0] = -is * (1 + arg);
    out[1] = (is * 3 * arg) / v;
  }
}

/** The critical voltage above which the step limit applies: nVt·ln(nVt / (√2·Is)). */
export function criticalVoltage(is: number, nvt: number): number {
  return nvt * Math.log(nvt / (Math.SQRT2 * is));
}

/**
 * SPICE's junction voltage limiting (pnjlim). Given the voltage Newton proposes and the one used
 * in the previous iteration, returns the voltage to evaluate the junction at. When the proposal
 * is above vcrit and more than 2·nVt away, the step is taken on a logarithmic scale, so the
 * exponential's current changes by at most a sensible factor per iteration; large negative
 * steps are held to one volt below the previous value. `limited` tells the caller that the
 * iterate was changed (and so has not converged).
 */
export function limitJunction(vnew: number, vold: number, nvt: number, vcrit: number): number {
  if (vnew > vcrit && Math.abs(vnew - vold) > 2 * nvt) {
    if (vold > 0) {
      const arg = 1 + (vnew - vold) / nvt;
      return arg > 0 ? vold + nvt * Math.log(arg) : vcrit;
    }
    return nvt * Math.log(vnew / nvt);
  }
  if (vnew < 0) {
    const floor = vold > 0 ? -vold - 1 : 2 * vold - 1;
    if (vnew < floor) return floor;
  }
  return vnew;
}
