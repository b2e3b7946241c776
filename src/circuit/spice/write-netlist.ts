import { DEFAULT_DC_OPTIONS } from '../options.js';
import { opampSpiceLines } from '../devices/opamp.js';
import { potResistances } from '../devices/potentiometer.js';
import { GROUND, circuitNodes, type Circuit, type Element, type Model } from '../netlist.js';
import { asciiJson, writeElementAnnotation, writeTitle } from './annotation.js';
import { formatSpiceNumber as num } from './spice-number.js';

/**
 * Writes a Circuit as a netlist that ngspice runs unmodified, and that parseNetlist reads back to
 * the same Circuit.
 *
 * - Device laws are not restated here: op-amps become whatever `opampSpiceLines` gives, pots the two
 *   resistances `potResistances` gives, a switch one resistor of `ron` per closed contact pair (open
 *   contacts are left out, as the solver leaves them out).
 * - A capacitor's leakage (a fault model) becomes a resistor in parallel.
 * - The solver holds every node to ground through `gshunt` (default 1e-12 S) so that a node left
 *   floating by a fault still solves; the same shunt is written as `.options rshunt=…`, which
 *   Debian's ngspice honours. (The WebAssembly build the tests use ignores rshunt — found by
 *   trying it — and reaches floating nodes by its own fallbacks; 1e-12 S is below what the
 *   cross-checks can see.)
 * - The text is ASCII only: the in-process ngspice the tests use never returns from a netlist
 *   with other characters in it (found by trying; Debian's ngspice reads them). A title that had
 *   to change is kept exactly in a `*@title` annotation, JSON annotations escape the rest.
 * - Names SPICE would misread (a node "+12v" is fine in ngspice, but "a b" or "x=1" is not; an
 *   element whose name does not start with its kind's letter) are renamed, and `*@` comments
 *   record the original so our reader restores it (see annotation.ts).
 */

export interface WriteNetlistOptions {
  /** Analysis cards, written before `.end`; default `['.op']`. */
  analyses?: string[];
  /** Conductance from every node to ground, as the solver's `gshunt`; 0 writes no shunt. */
  gshunt?: number;
  /**
   * Starting guesses for ngspice (`.nodeset`), by circuit node — usually our own operating point.
   * Some boards (the demo board among them) defeat ngspice's gmin and source stepping from 0 V;
   * started near the answer, its Newton settles on its own solution of the same equations.
   */
  nodeset?: Record<string, number>;
}

const LETTER: Record<Exclude<Element['kind'], 'opamp' | 'pot' | 'switch'>, string> = {
  resistor: 'r',
  capacitor: 'c',
  inductor: 'l',
  vsource: 'v',
  isource: 'i',
  diode: 'd',
  bjt: 'q',
  vcvs: 'e',
  vccs: 'g',
};

const SAFE_CHARS = /^[a-z0-9_]+$/;
// Words ngspice's expression parser takes as operators, constants or functions of time: a node so
// named breaks the B-source lines an op-amp is written as.
const RESERVED = new Set(['gnd', 'ne', 'eq', 'gt', 'lt', 'ge', 'le', 'and', 'or', 'not', 'pi', 'e', 'time', 'temper', 'hertz']);
const isSafe = (name: string) => SAFE_CHARS.test(name) && !RESERVED.has(name);

class Names {
  private readonly used = new Set<string>();
  constructor(reserved: Iterable<string> = []) {
    for (const name of reserved) this.used.add(name);
  }
  /** A fresh SPICE-safe name, as close to `wanted` as possible. */
  take(wanted: string): string {
    let base = wanted.toLowerCase().replace(/\+/g, 'p').replace(/-/g, 'm').replace(/[^a-z0-9_]/g, '_');
    if (base === '') base = 'n';
    let name = base;
    for (let i = 2; this.used.has(name); i++) name = `${base}_${i}`;
    this.used.add(name);
    return name;
  }
  reserve(name: string): void {
    this.used.add(name);
  }
}

/** Circuit node -> the node name the written netlist uses (most names pass through unchanged). */
export function spiceNodeNames(circuit: Circuit): Map<string, string> {
  const nodes = circuitNodes(circuit);
  const names = new Names(nodes.filter(isSafe));
  const map = new Map<string, string>([[GROUND, GROUND]]);
  for (const n of nodes) map.set(n, isSafe(n) ? n : names.take(`n_${n}`));
  return map;
}

function modelCard(name: string, model: Model): string {
  const params = Object.entries(model.params)
    .map(([k, v]) => `${k.toLowerCase()}=${num(v)}`)
    .join(' ');
  return `.model ${name} ${model.type.toLowerCase()}(${params})`;
}

/** Whether `writeOne` says everything about the element, so no annotation is needed. */
function plainlyWritten(el: Element): boolean {
  switch (el.kind) {
    case 'opamp':
    case 'pot':
    case 'switch':
      return false;
    case 'resistor':
      if (el.powerRating !== undefined) return false;
      break;
    case 'capacitor':
      if (el.leakage) return false;
      break;
    default:
      break;
  }
  return isSafe(el.name) && el.name.startsWith(LETTER[el.kind]);
}

export function writeNetlist(circuit: Circuit, options: WriteNetlistOptions = {}): string {
  const nodeMap = spiceNodeNames(circuit);
  const n = (node: string) => nodeMap.get(node) ?? node;

  const modelNames = new Names();
  const modelMap = new Map<string, string>();
  for (const key of Object.keys(circuit.models)) {
    if (isSafe(key)) modelNames.reserve(key);
  }
  for (const key of Object.keys(circuit.models)) modelMap.set(key, isSafe(key) ? key : modelNames.take(`m_${key}`));

  const elementNames = new Names(circuit.elements.filter(plainlyWritten).map((e) => e.name));
  const title = writeTitle(circuit.title);
  const out: string[] = [title.line];
  out.push('* written by voltwalk; node 0 is ground; *@ lines let voltwalk read this file back');
  if (title.annotation) out.push(title.annotation);
  // A name with spaces or non-ASCII characters is written as a JSON string.
  const literal = (name: string) => (/^[\x21-\x7e]+$/.test(name) && !name.startsWith('"') ? name : asciiJson(name));
  for (const [original, safe] of nodeMap) if (original !== safe) out.push(`*@node ${safe} ${literal(original)}`);
  for (const [original, safe] of modelMap) if (original !== safe) out.push(`*@model ${safe} ${literal(original)}`);

  for (const el of circuit.elements) {
    const plain = plainlyWritten(el);
    const spiceName = (letter: string, suffix = '') =>
      plain ? el.name : elementNames.take(`${el.name.startsWith(letter) ? '' : letter}${el.name}${suffix}`);
    const lines: string[] = [];
    switch (el.kind) {
      case 'resistor':
        lines.push(`${spiceName('r')} ${n(el.nodes[0])} ${n(el.nodes[1])} ${num(el.value)}`);
        break;
      case 'capacitor':
        lines.push(`${spiceName('c')} ${n(el.nodes[0])} ${n(el.nodes[1])} ${num(el.value)}`);
        if (el.leakage) lines.push(`${spiceName('r', '_leak')} ${n(el.nodes[0])} ${n(el.nodes[1])} ${num(1 / el.leakage)}`);
        break;
      case 'inductor':
        lines.push(`${spiceName('l')} ${n(el.nodes[0])} ${n(el.nodes[1])} ${num(el.value)}`);
        break;
      case 'vsource':
      case 'isource': {
        const ac = el.ac ? ` ac ${num(el.ac.mag)} ${num(el.ac.phaseDeg)}` : '';
        lines.push(`${spiceName(LETTER[el.kind])} ${n(el.nodes[0])} ${n(el.nodes[1])} dc ${num(el.dc)}${ac}`);
        break;
      }
      case 'diode':
        lines.push(`${spiceName('d')} ${n(el.nodes[0])} ${n(el.nodes[1])} ${modelMap.get(el.model) ?? el.model}${el.area !== undefined ? ` ${num(el.area)}` : ''}`);
        break;
      case 'bjt':
        lines.push(
          `${spiceName('q')} ${el.nodes.map(n).join(' ')} ${modelMap.get(el.model) ?? el.model}${el.area !== undefined ? ` ${num(el.area)}` : ''}`,
        );
        break;
      case 'vcvs':
        lines.push(`${spiceName('e')} ${el.nodes.map(n).join(' ')} ${num(el.gain)}`);
        break;
      case 'vccs':
        lines.push(`${spiceName('g')} ${el.nodes.map(n).join(' ')} ${num(el.gm)}`);
        break;
      case 'pot': {
        const [aw, wb] = potResistances(el);
        lines.push(`${spiceName('r', '_aw')} ${n(el.nodes[0])} ${n(el.nodes[1])} ${num(aw)}`);
        lines.push(`${spiceName('r', '_wb')} ${n(el.nodes[1])} ${n(el.nodes[2])} ${num(wb)}`);
        break;
      }
      case 'switch':
        for (const [i, j] of el.positions[el.position] ?? []) {
          lines.push(`${spiceName('r', `_${i}_${j}`)} ${n(el.nodes[i])} ${n(el.nodes[j])} ${num(el.ron)}`);
        }
        break;
      case 'opamp': {
        const safeName = elementNames.take(el.name);
        lines.push(...opampSpiceLines({ ...el, name: safeName, nodes: [n(el.nodes[0]), n(el.nodes[1]), n(el.nodes[2]), n(el.nodes[3]), n(el.nodes[4])] }));
        break;
      }
    }
    if (plain) out.push(...lines);
    else out.push(writeElementAnnotation(el), ...lines, '*@end');
  }

  for (const [key, model] of Object.entries(circuit.models)) out.push(modelCard(modelMap.get(key) ?? key, model));
  const gshunt = options.gshunt ?? DEFAULT_DC_OPTIONS.gshunt;
  if (gshunt > 0) out.push(`.options rshunt=${num(1 / gshunt)}`);
  if (circuit.temperatureC !== undefined) out.push(`.temp ${num(circuit.temperatureC)}`);
  if (options.nodeset) {
    const guesses = Object.entries(options.nodeset).filter(([node, v]) => node !== GROUND && nodeMap.has(node) && Number.isFinite(v));
    if (guesses.length > 0) {
      out.push('* starting guesses only: ngspice iterates from here to its own operating point');
      for (let i = 0; i < guesses.length; i += 6) {
        out.push(`${i === 0 ? '.nodeset' : '+'} ${guesses.slice(i, i + 6).map(([node, v]) => `v(${n(node)})=${num(v)}`).join(' ')}`);
      }
    }
  }
  out.push(...(options.analyses ?? ['.op']));
  out.push('.end');
  return `${out.join('\n')}\n`;
}
