/**
 * The golden netlists in tests/reference/netlists and the one way to run any Circuit through the
 * reference simulator with its own node names, whichever form the netlist had to take for ngspice.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Circuit } from '../../src/circuit/netlist.js';
import { parseNetlist, spiceNodeNames, writeNetlist, type Analysis } from '../../src/circuit/spice/index.js';
import { ngspiceAc, ngspiceOp, type AcPoint, type NgspiceOp } from './ngspice.js';

export const NETLIST_DIR = join(dirname(fileURLToPath(import.meta.url)), 'netlists');

export interface ReferenceNetlist {
  file: string;
  text: string;
  circuit: Circuit;
  analyses: Analysis[];
}

export function referenceNetlists(): ReferenceNetlist[] {
  return readdirSync(NETLIST_DIR)
    .filter((f) => f.endsWith('.cir'))
    .sort()
    .map((file) => {
      const text = readFileSync(join(NETLIST_DIR, file), 'utf8');
      const { circuit, analyses } = parseNetlist(text, file);
      return { file, text, circuit, analyses };
    });
}

/**
 * The text ngspice is given for a circuit: the file itself when ngspice can read it as written,
 * else our writer's form (op-amps in our instance form become the solver's own ngspice lines).
 */
export function referenceText(entry: Pick<ReferenceNetlist, 'text' | 'circuit'>): { text: string; rename: Map<string, string> } {
  const needsWriter = entry.circuit.elements.some((e) => e.kind === 'opamp' || e.kind === 'pot' || e.kind === 'switch');
  if (!needsWriter) return { text: entry.text, rename: new Map() };
  return { text: writeNetlist(entry.circuit), rename: spiceNodeNames(entry.circuit) };
}

function byCircuitNode<T>(rename: Map<string, string>, spice: Record<string, T>): Record<string, T> {
  const back = new Map([...rename].map(([ours, theirs]) => [theirs, ours]));
  const out: Record<string, T> = {};
  for (const [node, value] of Object.entries(spice)) out[back.get(node) ?? node] = value;
  return out;
}

/** ngspice's operating point of a golden netlist, keyed by our node names. */
export async function referenceOp(entry: Pick<ReferenceNetlist, 'text' | 'circuit'>): Promise<NgspiceOp> {
  const { text, rename } = referenceText(entry);
  const op = await ngspiceOp(text);
  return { ...op, nodes: byCircuitNode(rename, op.nodes) };
}

/** ngspice's small-signal response of a golden netlist at one frequency, keyed by our node names. */
export async function referenceAc(entry: Pick<ReferenceNetlist, 'text' | 'circuit'>, frequencyHz: number): Promise<Record<string, AcPoint>> {
  const { text, rename } = referenceText(entry);
  return byCircuitNode(rename, await ngspiceAc(text, frequencyHz));
}

/** The frequencies an `.ac` card sweeps, as SPICE spaces them. */
export function sweepFrequencies(card: Extract<Analysis, { kind: 'ac' }>): number[] {
  const { sweep, points, start, stop } = card;
  if (sweep === 'lin') {
    if (points === 1) return [start];
    return Array.from({ length: points }, (_, i) => start + ((stop - start) * i) / (points - 1));
  }
  const perDecade = sweep === 'dec' ? points : points / Math.log10(2);
  const count = Math.floor(Math.log10(stop / start) * perDecade + 1e-9) + 1;
  return Array.from({ length: count }, (_, i) => start * Math.pow(10, i / perDecade));
}
