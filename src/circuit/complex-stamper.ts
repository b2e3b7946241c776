/**
 * The small-signal counterpart of Stamper: complex entries kept as separate real and imaginary
 * arrays. The AC system starts from the DC Jacobian at the operating point (copied in as the real
 * part); devices then add their susceptances and their AC excitation here. Ground (-1) is skipped.
 */
import { StampError } from './errors.js';

export class ComplexStamper {
  readonly size: number;
  readonly re: Float64Array;
  readonly im: Float64Array;
  readonly bRe: Float64Array;
  readonly bIm: Float64Array;
  owner = '';

  constructor(size: number) {
    this.size = size;
    this.re = new Float64Array(size * size);
    this.im = new Float64Array(size * size);
    this.bRe = new Float64Array(size);
    this.bIm = new Float64Array(size);
  }

  matrix(row: number, col: number, re: number, im: number): void {
    if (row < 0 || col < 0) return;
    if (!Number.isFinite(re) || !Number.isFinite(im)) {
      throw new StampError(this.owner, `AC matrix entry (${row}, ${col})`, Number.isFinite(re) ? im : re);
    }
    const k = row * this.size + col;
    this.re[k] += re;
    this.im[k] += im;
  }

  rhs(row: number, re: number, im: number): void {
    if (row < 0) return;
    if (!Number.isFinite(re) || !Number.isFinite(im)) {
      throw new StampError(this.owner, `AC right-hand side (${row})`, Number.isFinite(re) ? im : re);
    }
    this.bRe[row] += re;
    this.bIm[row] += im;
  }

  /** An admittance re + j·im between p and q. */
  admittance(p: number, q: number, re: number, im: number): void {
    this.matrix(p, p, re, im);
    this.matrix(q, q, re, im);
    this.matrix(p, q, -re, -im);
    this.matrix(q, p, -re, -im);
  }

  /** A phasor current flowing from p through the element to q. */
  current(p: number, q: number, re: number, im: number): void {
    this.rhs(p, -re, -im);
    this.rhs(q, re, im);
  }
}
