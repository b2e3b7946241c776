/**
 * What every compiled device offers the solver. A device is built once per circuit compile with
 * its unknown indices resolved (ground = -1), then asked to stamp its linearised companion model
 * at each Newton iterate, and to report its true terminal currents at the answer.
 */
import type { Element } from '../netlist.js';
import type { Stamper } from '../stamper.js';
import type { ComplexStamper } from '../complex-stamper.js';

export interface StampContext {
  /** The iterate the companion model is linearised at. */
  x: Float64Array;
  /** Thermal voltage kT/q at the analysis temperature. */
  vt: number;
  /** SPICE GMIN across every junction. */
  gmin: number;
  /** Factor on every independent source (source stepping); 1 normally. */
  sourceScale: number;
  /** Apply junction voltage limiting (off when taking the small-signal Jacobian at the answer). */
  limit: boolean;
  /** Devices add 1 when limiting changed the voltage they were given. */
  limited: number;
}

export type JunctionRegion =
  | 'off'
  | 'forward'
  | 'reverse'
  | 'breakdown'
  | 'active'
  | 'saturated'
  | 'reverse-active'
  | 'cutoff';

export interface Device {
  readonly name: string;
  readonly element: Element;
  stamp(s: Stamper, ctx: StampContext): void;
  /** Seeds junction memory for limiting: from x (warm start) or SPICE's initial junction guesses (x null). */
  seed?(x: Float64Array | null, vt: number): void;
  /** Currents flowing into each of element.nodes from the circuit, at x, by the device's own law. */
  terminalCurrents(x: Float64Array, ctx: StampContext): number[];
  region?(x: Float64Array, ctx: StampContext): JunctionRegion;
  /** Reactive parts and small-signal excitation at angular frequency ω (the real Jacobian comes from stamp()). */
  stampAc?(s: ComplexStamper, omega: number): void;
  /** Names `set` accepts: element fields ("value", "position", "dc", "vos"…) or model parameters ("IS", "BF"…). */
  readonly settable?: readonly string[];
  /**
   * Changes one value of the compiled device in place, checked as at compile time. The matrix
   * pattern never changes, so a solver keeps its LU plans; a bad value throws UserInputError and
   * leaves the device as it was.
   */
  set?(field: string, value: number): void;
}

/** How a device asks for unknowns while it is being compiled. */
export interface Allocator {
  /** Index of a circuit node (ground "0" gives -1). */
  node(name: string): number;
  /** A private node inside the device, e.g. the base behind RB. */
  internal(owner: string, label: string): number;
  /** A branch-current unknown owned by the device. */
  branch(owner: string): number;
  warn(message: string): void;
}
