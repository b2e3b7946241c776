import { BUILTIN_OPAMP_MODELS } from '../../board/defaults.js';
import type { OpAmp, OpAmpParams } from '../netlist.js';
import { readSpiceNumber } from './spice-number.js';

/**
 * Our op-amp in a hand-written netlist, as a subcircuit instance:
 *
 *   Xname in+ in- out v+ v- MODEL [gain=… rout=… rin=… headroom=… iq=… vos=… en=… in=…]
 *
 * MODEL is a built-in op-amp model (e.g. TL072), whose figures are the starting point, or the
 * word `opamp`, which needs every parameter. The behavioural law is the solver's (see
 * src/circuit/devices); the writer turns it into ngspice lines, so this form is ours, not ngspice's.
 */

export const OPAMP_INSTANCE_FORM = `Xname in+ in- out v+ v- MODEL [param=value ...], MODEL one of ${[
  'opamp',
  ...Object.keys(BUILTIN_OPAMP_MODELS),
].join(', ')} (params ${'gain rout rin headroom iq vos en in'})`;

const PARAM_KEYS: ReadonlyArray<keyof OpAmpParams> = ['gain', 'rout', 'rin', 'headroom', 'iq', 'vos', 'en', 'in'];

export function readOpAmpInstance(tokens: string[], node: (token: string) => string): { element: OpAmp } | { problem: string } {
  const name = tokens[0].toLowerCase();
  const words = tokens.slice(1).join(' ').replace(/\s*=\s*/g, '=').split(/\s+/).filter(Boolean);
  const positional = words.filter((w) => !w.includes('='));
  if (positional.length !== 6) {
    return { problem: `${name}: subcircuit instances are read only in the op-amp form (five nodes and a model), found ${positional.length} field(s)` };
  }
  const modelName = positional[5].toUpperCase();
  const builtin = Object.entries(BUILTIN_OPAMP_MODELS).find(([key]) => key.toUpperCase() === modelName)?.[1];
  if (!builtin && modelName !== 'OPAMP') {
    return { problem: `${name}: subcircuit ${positional[5]} is not an op-amp model we know` };
  }
  const params: Partial<OpAmpParams> = builtin ? Object.fromEntries(PARAM_KEYS.map((k) => [k, builtin[k]])) : {};
  for (const word of words.filter((w) => w.includes('='))) {
    const [key, text] = word.split('=', 2);
    const k = key.toLowerCase() as keyof OpAmpParams;
    if (!PARAM_KEYS.includes(k)) return { problem: `${name}: parameter ${key} is not an op-amp parameter` };
    const read = readSpiceNumber(text);
    if (!read) return { problem: `${name}: ${key}=${text} is not a SPICE number` };
    params[k] = read.value;
  }
  const missing = PARAM_KEYS.filter((k) => params[k] === undefined);
  if (missing.length > 0) return { problem: `${name}: the opamp form needs ${missing.join(', ')}` };
  const p = params as OpAmpParams;
  if (!(p.gain > 0) || !(p.rin > 0) || p.rout < 0 || p.headroom < 0 || p.iq < 0) {
    return { problem: `${name}: gain and rin must be above zero; rout, headroom and iq must not be negative` };
  }
  const [a, b, c, d, e] = positional.slice(0, 5).map(node);
  return { element: { kind: 'opamp', name, nodes: [a, b, c, d, e], params: p } };
}
