/** The shape of a DC operating point, as every other part of voltwalk reads it. */
import type { JunctionRegion } from './devices/device.js';

export interface ElementResult {
  /**
   * Two-terminal parts: current from the first node through the part to the second.
   * bjt: collector current (into the collector). opamp: output current (out of the output pin).
   * pot: current into terminal a. switch: current into its first terminal.
   */
  current: number;
  /** Power the element absorbs, W (negative when it delivers, e.g. a source). */
  power: number;
  /** Set on resistors with a powerRating that dissipate more than it. */
  overRating?: boolean;
  /** Current into each of the element's nodes, in the element's node order. */
  terminalCurrents: number[];
}

export interface DcSolution {
  converged: true;
  /** Every circuit node (lower case) to its voltage; "0" is ground at 0 V. */
  nodes: Record<string, number>;
  /** V sources: branch current, positive into + through the source (SPICE's sense). I sources: their value. */
  sourceCurrents: Record<string, number>;
  elements: Record<string, ElementResult>;
  junctions: Record<string, JunctionRegion>;
  strategy: 'newton' | 'gmin' | 'source';
  iterations: number;
  warnings: string[];
  /** Every unknown (including device-internal nodes and branch currents), for warm starts. */
  unknowns?: Record<string, number>;
}
