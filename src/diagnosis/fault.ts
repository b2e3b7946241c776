import type { PartKind } from '../schemas/board.js';
import type { FaultModeId } from './fault-modes.js';

/** One candidate single fault on a board. Plain data, so it can be listed, saved and compared. */
export interface Fault {
  /** Unique on the board: "R21/open", "R21/wrong-value/47000", "U2/bridge/3-4". */
  id: string;
  /** Designator of the suspect part (the power header's for rail faults). */
  part: string;
  kind: PartKind | 'rail';
  mode: FaultModeId;
  /** Plain words: "open", "wrong value 47 kΩ (yellow read for violet)". */
  fault: string;
  /** Relative prior weight. */
  prior: number;
  /** wrong-value: the value fitted, SI. */
  value?: number;
  /** bridge: the two pins joined. */
  pins?: [string, string];
  /** Op-amp faults of one amplifier of a package: its letter ("a", "b" …). */
  amplifier?: string;
  /** rail-missing: the rail's id. */
  rail?: string;
  /** other-pinout: for each pin of the part, the pin whose net it now lands on. */
  pinMap?: Record<string, string>;
}
