import { z } from 'zod';
import type { Element } from '../netlist.js';

/**
 * Annotations: `*@` comment lines our writer leaves so our reader can restore what SPICE text
 * cannot say (a pot's position and taper, a switch's positions, an op-amp's parameters, a name
 * SPICE would not accept). ngspice reads them as comments, so the netlist still runs unmodified.
 *
 *   *@title <JSON string>                    the title, when the first line had to be made ASCII
 *   *@node <spice node> <circuit node>      a node renamed for SPICE
 *   *@model <spice name> <circuit name>     a model renamed for SPICE
 *   *@element <element as JSON>              the element the following SPICE lines stand for…
 *   …SPICE lines…
 *   *@end                                    …up to here; our reader skips them
 *
 * The JSON is checked against these schemas, so a hand-edited annotation fails with the line
 * number and the field rather than producing a half-read element.
 */

const name = z.string().min(1);
const node = z.string().min(1);
const finite = z.number().finite();
const two = z.tuple([node, node]);
const four = z.tuple([node, node, node, node]);
const ac = z.object({ mag: finite, phaseDeg: finite }).strict();

const ElementSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('resistor'), name, nodes: two, value: finite, powerRating: finite.positive().optional() }).strict(),
  z.object({ kind: z.literal('capacitor'), name, nodes: two, value: finite, leakage: finite.nonnegative().optional() }).strict(),
  z.object({ kind: z.literal('inductor'), name, nodes: two, value: finite }).strict(),
  z.object({ kind: z.literal('vsource'), name, nodes: two, dc: finite, ac: ac.optional() }).strict(),
  z.object({ kind: z.literal('isource'), name, nodes: two, dc: finite, ac: ac.optional() }).strict(),
  z.object({ kind: z.literal('diode'), name, nodes: two, model: name, area: finite.positive().optional() }).strict(),
  z
    .object({ kind: z.literal('bjt'), name, nodes: z.tuple([node, node, node]), model: name, area: finite.positive().optional() })
    .strict(),
  z.object({ kind: z.literal('vcvs'), name, nodes: four, gain: finite }).strict(),
  z.object({ kind: z.literal('vccs'), name, nodes: four, gm: finite }).strict(),
  z
    .object({
      kind: z.literal('opamp'),
      name,
      nodes: z.tuple([node, node, node, node, node]),
      params: z
        .object({
          gain: finite.positive(),
          rout: finite.nonnegative(),
          rin: finite.positive(),
          headroom: finite.nonnegative(),
          iq: finite.nonnegative(),
          vos: finite,
          en: finite.nonnegative(),
          in: finite.nonnegative(),
        })
        .strict(),
    })
    .strict(),
  z
    .object({
      kind: z.literal('pot'),
      name,
      nodes: z.tuple([node, node, node]),
      value: finite.positive(),
      position: z.number().min(0).max(1),
      taper: z.enum(['linear', 'log']),
    })
    .strict(),
  z
    .object({
      kind: z.literal('switch'),
      name,
      nodes: z.array(node).min(2),
      positions: z.record(z.string(), z.array(z.tuple([z.number().int().nonnegative(), z.number().int().nonnegative()]))),
      position: z.string(),
      ron: finite.nonnegative(),
    })
    .strict(),
]);

// Keeps the schema and the circuit model from drifting apart: a mismatch is a type error here.
const checkShape = (e: z.infer<typeof ElementSchema>): Element => e;
void checkShape;



/** Parses an `*@element` JSON payload; returns the element or a one-line reason. */
export function readElementAnnotation(json: string): { element: Element } | { problem: string } {
  let raw: unknown;
  try {
    raw = JSON.parse(json);
  } catch {
    return { problem: 'the *@element annotation is not valid JSON' };
  }
  const parsed = ElementSchema.safeParse(raw);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const where = issue.path.length ? ` at ${issue.path.join('.')}` : '';
    return { problem: `the *@element annotation is not a circuit element${where}: ${issue.message}` };
  }
  const element = parsed.data as Element;
  if (element.kind === 'switch') {
    if (!(element.position in element.positions)) {
      return { problem: `switch ${element.name}: position "${element.position}" is not one of its positions` };
    }
    for (const pairs of Object.values(element.positions)) {
      for (const [a, b] of pairs) {
        if (a >= element.nodes.length || b >= element.nodes.length) {
          return { problem: `switch ${element.name}: a contact pair names terminal ${Math.max(a, b)}, but it has ${element.nodes.length}` };
        }
      }
    }
  }
  return { element };
}

/** JSON with every non-ASCII character escaped: the in-process ngspice hangs on non-ASCII text. */
export function asciiJson(value: unknown): string {
  return JSON.stringify(value).replace(/[\u0080-\uffff]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}

export function writeElementAnnotation(element: Element): string {
  return `*@element ${asciiJson(element)}`;
}

/** The title line in ASCII, and an annotation restoring the original when it had to change. */
export function writeTitle(title: string): { line: string; annotation?: string } {
  const flat = title.replace(/[\r\n]+/g, ' ').trim() || 'voltwalk circuit';
  const line = flat
    .replace(/[\u2012-\u2015\u2212]/g, '-')
    .replace(/±/g, '+/-')
    .replace(/Ω/g, 'ohm')
    .replace(/[µμ]/g, 'u')
    .replace(/°/g, ' deg')
    .replace(/[^\x20-\x7e]/g, '?');
  return line === title ? { line } : { line, annotation: `*@title ${asciiJson(title)}` };
}
