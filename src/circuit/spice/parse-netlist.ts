import { UserInputError, type Problem } from '../../errors.js';
import { GROUND, type AcSpec, type Circuit, type Element, type Model, type ModelType } from '../netlist.js';
import { readElementAnnotation } from './annotation.js';
import { splitNetlist, type LogicalLine } from './logical-lines.js';
import { readOpAmpInstance, OPAMP_INSTANCE_FORM } from './opamp-instance.js';
import { ACCEPTED_SPICE_NUMBER, readSpiceNumber } from './spice-number.js';

/**
 * Reads the SPICE subset voltwalk solves into a Circuit.
 *
 * Elements (the first letter of the name decides the kind, as in SPICE):
 *   Rname n1 n2 value              Cname n1 n2 value [ic=v]        Lname n1 n2 value [ic=i]
 *   Vname n+ n- [[DC] v] [AC mag [phase]]                         Iname n+ n- (same)
 *   Dname anode cathode model [area]                              Qname c b e [substrate] model [area]
 *   Ename p n cp cn gain           Gname p n cp cn gm
 *   Xname in+ in- out v+ v- opamp [gain=… rout=… rin=… headroom=… iq=… vos=… en=… in=…]
 * Cards: .model name D|NPN|PNP [(]param=value …[)], .op, .ac dec|oct|lin points fstart fstop,
 * .temp t, .end. Output and other-analysis cards (.tran .dc .print .plot .save .options …) are
 * ignored with a warning; cards that would change the circuit in ways we cannot follow
 * (.include .lib .subckt .param …) are refused.
 *
 * Names and nodes are lower-cased; `gnd` is ground. Numbers follow SPICE (see spice-number.ts):
 * `M` is milli, `MEG` is mega, and `4k7` is 4k (SPICE has no letter code) — both warned about.
 */

export type Analysis =
  | { kind: 'op' }
  | { kind: 'ac'; sweep: 'dec' | 'oct' | 'lin'; points: number; start: number; stop: number };

export interface ParsedNetlist {
  circuit: Circuit;
  warnings: string[];
  /** The .op and .ac cards, in order. */
  analyses: Analysis[];
}

export const ACCEPTED_ELEMENT_LETTERS = 'R, C, L, V, I, D, Q, E, G, and X for the op-amp form';
const ACCEPTED_CARDS = '.model, .op, .ac, .temp, .end';
const MODEL_TYPES: readonly ModelType[] = ['D', 'NPN', 'PNP'];
const IGNORED_CARDS = new Set([
  '.tran', '.dc', '.noise', '.tf', '.sens', '.disto', '.pz', '.four', '.print', '.plot', '.save', '.probe',
  '.meas', '.measure', '.width', '.option', '.options', '.opt', '.title',
]);

class Reader {
  readonly problems: Problem[] = [];
  readonly warnings: string[] = [];
  readonly elements: Element[] = [];
  readonly models: Record<string, Model> = {};
  readonly analyses: Analysis[] = [];
  readonly nodeNames = new Map<string, string>();
  readonly modelNames = new Map<string, string>();
  temperatureC: number | undefined;
  private readonly names = new Map<string, number>();

  constructor(private readonly file: string | undefined) {}

  problem(line: number, message: string, accepted?: string, code = 'netlist.invalid'): void {
    this.problems.push({ code, ...(this.file ? { file: this.file } : {}), path: `line ${line}`, message, ...(accepted ? { accepted } : {}) });
  }

  warn(line: number, message: string): void {
    this.warnings.push(`${this.file ? `${this.file}: ` : ''}line ${line}: ${message}`);
  }

  node(token: string): string {
    const lower = token.toLowerCase();
    if (lower === 'gnd') return GROUND;
    return this.nodeNames.get(lower) ?? lower;
  }

  modelName(token: string): string {
    const lower = token.toLowerCase();
    return this.modelNames.get(lower) ?? lower;
  }

  add(line: number, element: Element): void {
    const first = this.names.get(element.name);
    if (first !== undefined) {
      this.problem(line, `element ${element.name} is defined twice (first on line ${first})`, 'unique element names', 'netlist.duplicate-name');
      return;
    }
    this.names.set(element.name, line);
    this.elements.push(element);
  }

  /** Reads a SPICE number for `field`, warning about the milli/mega and letter-code traps. */
  number(line: number, token: string | undefined, field: string, kind?: Element['kind']): number | undefined {
    if (token === undefined) {
      this.problem(line, `${field} is missing`, ACCEPTED_SPICE_NUMBER, 'netlist.missing-value');
      return undefined;
    }
    const read = readSpiceNumber(token);
    if (!read) {
      this.problem(line, `${field} "${token}" is not a SPICE number`, ACCEPTED_SPICE_NUMBER, 'netlist.bad-number');
      return undefined;
    }
    if (read.suffix === 'm' && (kind === 'resistor' || /^[^a-z]*M(?!EG|eg|IL|il)/.test(token))) {
      this.warn(
        line,
        `${field} "${token}" reads as ${read.value} (SPICE's M and m both mean milli); write ${token.replace(/m.*$/i, 'meg')} for mega`,
      );
    }
    if (read.ignored && /^\d/.test(read.ignored)) {
      this.warn(line, `${field} "${token}" reads as ${read.value}: SPICE has no letter code and ignores what follows the scale letter; write e.g. 4.7k for 4k7`);
    }
    return read.value;
  }
}

function tokensOf(text: string): string[] {
  return text.split(/\s+/).filter(Boolean);
}

/** Splits `key=value` tokens (spaces around `=` allowed) from positional ones. */
function splitParams(tokens: string[]): { positional: string[]; params: Array<[string, string]> } {
  const joined = tokens.join(' ').replace(/\s*=\s*/g, '=');
  const positional: string[] = [];
  const params: Array<[string, string]> = [];
  for (const token of tokensOf(joined)) {
    const eq = token.indexOf('=');
    if (eq > 0) params.push([token.slice(0, eq).toLowerCase(), token.slice(eq + 1)]);
    else positional.push(token);
  }
  return { positional, params };
}

function readTwoTerminal(r: Reader, line: LogicalLine, tokens: string[], kind: 'resistor' | 'capacitor' | 'inductor'): void {
  const name = tokens[0].toLowerCase();
  const { positional, params } = splitParams(tokens.slice(1));
  if (positional.length < 3) {
    r.problem(line.line, `${name}: expected "${tokens[0]} node1 node2 value", found ${positional.length} field(s) after the name`, `${tokens[0][0]}name node1 node2 value`);
    return;
  }
  if (positional.length > 3) {
    r.problem(line.line, `${name}: unexpected "${positional.slice(3).join(' ')}" after the value`, `${tokens[0][0]}name node1 node2 value`);
    return;
  }
  for (const [key] of params) {
    if (key === 'ic' && kind !== 'resistor') {
      r.warn(line.line, `${name}: ic= sets a transient starting point; the operating point ignores it`);
      continue;
    }
    r.problem(line.line, `${name}: parameter ${key}= is not supported`, kind === 'resistor' ? 'no parameters' : 'ic=');
    return;
  }
  const value = r.number(line.line, positional[2], `${name} value`, kind);
  if (value === undefined) return;
  const nodes: [string, string] = [r.node(positional[0]), r.node(positional[1])];
  if (kind === 'resistor') {
    if (!(value > 0)) return r.problem(line.line, `${name}: resistance ${value} must be above zero`, 'a positive resistance');
    r.add(line.line, { kind, name, nodes, value });
  } else if (kind === 'capacitor') {
    if (value < 0) return r.problem(line.line, `${name}: capacitance ${value} must not be negative`, 'zero or more farads');
    r.add(line.line, { kind, name, nodes, value });
  } else {
    if (value < 0) return r.problem(line.line, `${name}: inductance ${value} must not be negative`, 'zero or more henries');
    r.add(line.line, { kind, name, nodes, value });
  }
}

const SOURCE_FORM = 'Vname n+ n- [DC] value [AC mag [phase]]';

function readSource(r: Reader, line: LogicalLine, tokens: string[], kind: 'vsource' | 'isource'): void {
  const name = tokens[0].toLowerCase();
  const form = kind === 'vsource' ? SOURCE_FORM : SOURCE_FORM.replace('Vname', 'Iname');
  if (/[({]/.test(line.text)) {
    r.problem(line.line, `${name}: source functions and expressions (sin, pulse, pwl, {…}) are not supported`, form);
    return;
  }
  if (tokens.length < 3) {
    r.problem(line.line, `${name}: expected two nodes after the name`, form);
    return;
  }
  const nodes: [string, string] = [r.node(tokens[1]), r.node(tokens[2])];
  let dc: number | undefined;
  let ac: AcSpec | undefined;
  let i = 3;
  while (i < tokens.length) {
    const word = tokens[i].toLowerCase();
    if (word === 'dc') {
      dc = r.number(line.line, tokens[i + 1], `${name} DC value`);
      if (dc === undefined) return;
      i += 2;
    } else if (word === 'ac') {
      const mag = tokens[i + 1] !== undefined ? readSpiceNumber(tokens[i + 1]) : undefined;
      const phase = mag && tokens[i + 2] !== undefined ? readSpiceNumber(tokens[i + 2]) : undefined;
      ac = { mag: mag ? mag.value : 1, phaseDeg: phase ? phase.value : 0 };
      i += 1 + (mag ? 1 : 0) + (phase ? 1 : 0);
    } else if (dc === undefined && readSpiceNumber(tokens[i])) {
      dc = r.number(line.line, tokens[i], `${name} DC value`);
      i += 1;
    } else {
      r.problem(line.line, `${name}: unexpected "${tokens[i]}"`, form);
      return;
    }
  }
  if (dc === undefined) {
    if (!ac) r.warn(line.line, `${name}: no DC value given; SPICE takes 0`);
    dc = 0;
  }
  r.add(line.line, { kind, name, nodes, dc, ...(ac ? { ac } : {}) });
}

function readSemiconductor(r: Reader, line: LogicalLine, tokens: string[], kind: 'diode' | 'bjt'): void {
  const name = tokens[0].toLowerCase();
  const form = kind === 'diode' ? 'Dname anode cathode model [area]' : 'Qname collector base emitter [substrate] model [area]';
  const { positional, params } = splitParams(tokens.slice(1));
  for (const [key] of params) {
    if (key === 'ic') {
      r.warn(line.line, `${name}: ic= sets a transient starting point; the operating point ignores it`);
      continue;
    }
    if (key === 'area') {
      positional.push(params.find(([k]) => k === 'area')![1]);
      continue;
    }
    return r.problem(line.line, `${name}: parameter ${key}= is not supported`, form);
  }
  const rest = positional.filter((t) => {
    if (t.toLowerCase() !== 'off') return true;
    r.warn(line.line, `${name}: "off" is a starting guess for the operating point; ignored`);
    return false;
  });
  const terminals = kind === 'diode' ? 2 : 3;
  // A BJT may carry a substrate node before its model; the model names decide which token is which.
  let modelAt = terminals;
  if (kind === 'bjt' && rest.length > 4 && !(r.modelName(rest[3]) in r.models) && r.modelName(rest[4]) in r.models) modelAt = 4;
  else if (kind === 'bjt' && rest.length === 5 && !readSpiceNumber(rest[4])) modelAt = 4;
  const modelToken = rest[modelAt];
  if (modelToken === undefined) return r.problem(line.line, `${name}: expected ${terminals} nodes and a model name`, form);
  const extra = rest.slice(modelAt + 1);
  if (extra.length > 1) return r.problem(line.line, `${name}: unexpected "${extra.slice(1).join(' ')}"`, form);
  const model = r.modelName(modelToken);
  const area = extra.length === 1 ? r.number(line.line, extra[0], `${name} area`) : undefined;
  if (extra.length === 1 && area === undefined) return;
  if (area !== undefined && !(area > 0)) return r.problem(line.line, `${name}: area ${area} must be above zero`, 'a positive number');
  if (modelAt === 4) {
    const substrate = r.node(rest[3]);
    if (substrate !== GROUND) r.warn(line.line, `${name}: substrate node ${substrate} ignored (it only carries junction capacitance)`);
  }
  const defined = r.models[model];
  if (!defined) return r.problem(line.line, `${name}: model ${model} has no .model card`, `.model ${model} ${kind === 'diode' ? 'D' : 'NPN|PNP'} (...)`, 'netlist.unknown-model');
  if ((kind === 'diode') !== (defined.type === 'D')) {
    return r.problem(line.line, `${name}: model ${model} is a ${defined.type} model`, kind === 'diode' ? 'a D model' : 'an NPN or PNP model');
  }
  const n = rest.slice(0, terminals).map((t) => r.node(t));
  if (kind === 'diode') r.add(line.line, { kind, name, nodes: [n[0], n[1]], model, ...(area !== undefined ? { area } : {}) });
  else r.add(line.line, { kind, name, nodes: [n[0], n[1], n[2]], model, ...(area !== undefined ? { area } : {}) });
}

function readControlled(r: Reader, line: LogicalLine, tokens: string[], kind: 'vcvs' | 'vccs'): void {
  const name = tokens[0].toLowerCase();
  const form = `${tokens[0][0].toUpperCase()}name p n cp cn ${kind === 'vcvs' ? 'gain' : 'gm'}`;
  if (/[({=]/.test(line.text)) return r.problem(line.line, `${name}: polynomial and expression forms are not supported`, form);
  if (tokens.length !== 6) return r.problem(line.line, `${name}: expected four nodes and a ${kind === 'vcvs' ? 'gain' : 'transconductance'}`, form);
  const value = r.number(line.line, tokens[5], `${name} ${kind === 'vcvs' ? 'gain' : 'gm'}`);
  if (value === undefined) return;
  const nodes: [string, string, string, string] = [r.node(tokens[1]), r.node(tokens[2]), r.node(tokens[3]), r.node(tokens[4])];
  if (kind === 'vcvs') r.add(line.line, { kind, name, nodes, gain: value });
  else r.add(line.line, { kind, name, nodes, gm: value });
}

function readModel(r: Reader, line: LogicalLine): void {
  const form = '.model name D|NPN|PNP (param=value ...)';
  const body = line.text.slice('.model'.length).replace(/[(),]/g, ' ').replace(/\s*=\s*/g, '=');
  const tokens = tokensOf(body);
  if (tokens.length < 2) return r.problem(line.line, '.model needs a name and a type', form);
  const name = r.modelName(tokens[0]);
  const type = tokens[1].toUpperCase() as ModelType;
  if (!MODEL_TYPES.includes(type)) return r.problem(line.line, `.model ${name}: type ${tokens[1]} is not supported`, 'D, NPN, PNP');
  if (r.models[name]) return r.problem(line.line, `.model ${name} is defined twice`, 'unique model names', 'netlist.duplicate-model');
  const params: Record<string, number> = {};
  for (const token of tokens.slice(2)) {
    const eq = token.indexOf('=');
    if (eq <= 0) return r.problem(line.line, `.model ${name}: "${token}" is not param=value`, form);
    const key = token.slice(0, eq).toUpperCase();
    const value = r.number(line.line, token.slice(eq + 1), `.model ${name} ${key}`);
    if (value === undefined) return;
    params[key] = value;
  }
  r.models[name] = { name, type, params };
}

function readAc(r: Reader, line: LogicalLine, tokens: string[]): void {
  const form = '.ac dec|oct|lin points fstart fstop';
  const sweep = tokens[1]?.toLowerCase();
  if (sweep !== 'dec' && sweep !== 'oct' && sweep !== 'lin') return r.problem(line.line, `.ac: sweep "${tokens[1] ?? ''}" is not dec, oct or lin`, form);
  const points = r.number(line.line, tokens[2], '.ac points');
  const start = r.number(line.line, tokens[3], '.ac start frequency');
  const stop = r.number(line.line, tokens[4], '.ac stop frequency');
  if (points === undefined || start === undefined || stop === undefined) return;
  if (!(points >= 1) || !(start > 0) || !(stop >= start)) return r.problem(line.line, '.ac: needs points ≥ 1 and 0 < fstart ≤ fstop', form);
  r.analyses.push({ kind: 'ac', sweep, points: Math.round(points), start, stop });
}

function readCard(r: Reader, line: LogicalLine, tokens: string[]): void {
  const card = tokens[0].toLowerCase();
  if (card === '.model') return readModel(r, line);
  if (card === '.op') {
    r.analyses.push({ kind: 'op' });
    return;
  }
  if (card === '.ac') return readAc(r, line, tokens);
  if (card === '.temp') {
    const t = r.number(line.line, tokens[1], '.temp');
    if (t !== undefined) r.temperatureC = t;
    return;
  }
  if (/^\.opt(ions?)?$/.test(card) && tokens.slice(1).every((t) => /^rshunt\s*=/i.test(t))) {
    // What our writer adds to mirror the solver's node shunt; the solver has its own.
    return;
  }
  if (card === '.nodeset' || card === '.ic') {
    r.warn(line.line, `${card} ignored: it only sets where ngspice starts iterating`);
    return;
  }
  if (IGNORED_CARDS.has(card)) {
    r.warn(line.line, `${card} ignored (only the operating point and small-signal AC are computed here)`);
    return;
  }
  r.problem(line.line, `${card} is not supported`, ACCEPTED_CARDS, 'netlist.unsupported-card');
}

function readElement(r: Reader, line: LogicalLine): void {
  const tokens = tokensOf(line.text);
  const letter = tokens[0][0].toUpperCase();
  switch (letter) {
    case 'R':
      return readTwoTerminal(r, line, tokens, 'resistor');
    case 'C':
      return readTwoTerminal(r, line, tokens, 'capacitor');
    case 'L':
      return readTwoTerminal(r, line, tokens, 'inductor');
    case 'V':
      return readSource(r, line, tokens, 'vsource');
    case 'I':
      return readSource(r, line, tokens, 'isource');
    case 'D':
      return readSemiconductor(r, line, tokens, 'diode');
    case 'Q':
      return readSemiconductor(r, line, tokens, 'bjt');
    case 'E':
      return readControlled(r, line, tokens, 'vcvs');
    case 'G':
      return readControlled(r, line, tokens, 'vccs');
    case 'X': {
      const read = readOpAmpInstance(tokens, (t) => r.node(t));
      if ('problem' in read) return r.problem(line.line, read.problem, OPAMP_INSTANCE_FORM);
      return r.add(line.line, read.element);
    }
    case '.':
      return readCard(r, line, tokens);
    default:
      r.problem(line.line, `"${tokens[0]}": element letter ${tokens[0][0]} is not supported`, ACCEPTED_ELEMENT_LETTERS, 'netlist.unsupported-element');
  }
}

/**
 * Parses a netlist. Throws UserInputError listing every problem with its line number; returns
 * the circuit, warnings (each naming its line) and the analysis cards.
 */
export function parseNetlist(text: string, file?: string): ParsedNetlist {
  const split = splitNetlist(text);
  const r = new Reader(file);

  // Node renames and models first: elements may use models defined further down, as in SPICE.
  for (const line of split.lines) {
    if (line.annotation) {
      const m = /^(node|model)\s+(\S+)\s+(.+)$/.exec(line.text);
      if (m) {
        let name = m[3];
        if (name.startsWith('"')) {
          try {
            name = String(JSON.parse(name));
          } catch {
            r.problem(line.line, `the *@${m[1]} annotation's name is not a valid JSON string`, `*@${m[1]} <spice name> <name or JSON string>`);
            continue;
          }
        }
        (m[1] === 'node' ? r.nodeNames : r.modelNames).set(m[2].toLowerCase(), name);
      }
    } else if (/^\.model\b/i.test(line.text)) {
      readModel(r, line);
    }
  }

  let title = split.title;
  let block: { element: Element; line: number } | undefined;
  for (const line of split.lines) {
    if (line.annotation) {
      if (/^(node|model)\s/.test(line.text)) continue;
      const t = /^title\s+(.*)$/.exec(line.text);
      if (t) {
        try {
          const value = JSON.parse(t[1]) as unknown;
          if (typeof value === 'string') title = value;
          else r.problem(line.line, 'the *@title annotation is not a JSON string', '*@title "the title"');
        } catch {
          r.problem(line.line, 'the *@title annotation is not valid JSON', '*@title "the title"');
        }
        continue;
      }
      if (line.text === 'end') {
        if (!block) r.problem(line.line, '*@end without an *@element before it', '*@element {...} … *@end');
        else if ((block.element.kind === 'diode' || block.element.kind === 'bjt') && !r.models[block.element.model]) {
          r.problem(block.line, `${block.element.name}: model ${block.element.model} has no .model card`, `.model ${block.element.model} ...`, 'netlist.unknown-model');
        } else r.add(block.line, block.element);
        block = undefined;
        continue;
      }
      const m = /^element\s+(.*)$/.exec(line.text);
      if (m) {
        if (block) r.problem(line.line, `*@element inside the *@element block that starts on line ${block.line}`, '*@element {...} … *@end');
        const read = readElementAnnotation(m[1]);
        if ('problem' in read) r.problem(line.line, read.problem, 'the JSON our writer leaves');
        else block = { element: read.element, line: line.line };
        continue;
      }
      r.warn(line.line, `annotation "*@${line.text.split(/\s/)[0]}" not understood; ignored`);
      continue;
    }
    if (block) continue; // the SPICE form of an annotated element
    if (line.text.startsWith('+')) {
      r.problem(line.line, 'a continuation line (+) with no line before it to continue', 'a "+" line directly after the line it continues');
      continue;
    }
    if (/^\.model\b/i.test(line.text)) continue;
    readElement(r, line);
  }
  if (block) r.problem(block.line, '*@element block has no *@end', '*@element {...} … *@end');
  if (split.endLine === undefined) r.warnings.push(`${file ? `${file}: ` : ''}no .end line; read to the end of the text`);
  if (split.textAfterEnd) r.warnings.push(`${file ? `${file}: ` : ''}text after .end (line ${split.endLine}) ignored`);

  if (r.problems.length === 0 && r.elements.length === 0) {
    r.problem(1, 'the netlist has no elements (the first line is always the title)', ACCEPTED_ELEMENT_LETTERS, 'netlist.empty');
  }
  if (r.problems.length > 0) throw new UserInputError(r.problems);

  const circuit: Circuit = {
    title,
    elements: r.elements,
    models: r.models,
    ...(r.temperatureC !== undefined ? { temperatureC: r.temperatureC } : {}),
  };
  return { circuit, warnings: r.warnings, analyses: r.analyses };
}
