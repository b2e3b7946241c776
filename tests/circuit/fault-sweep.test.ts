/**
 * Every single-part fault of a small rail-protected analog circuit must still solve: the fault
 * dictionary asks for exactly these operating points (opens and shorts of passives, reversed
 * junctions — the common field faults per Bandler & Salama, Proc. IEEE 73(8), 1985, in
 * REFERENCES.md). Checked: an answer comes back, every number is finite, and KCL holds at every
 * node with the reported element currents. The circuit is our own test fixture.
 */
import { describe, expect, it } from 'vitest';
import { solveDC, ledModel, type Circuit, type Element } from '../../src/circuit/index.js';
import { circuit, expectKclBalanced, D, OPAMP, Q, R, V, C } from './helpers.js';

const models = [
  { name: 'rect', type: 'D' as const, params: { IS: 1.4e-8, N: 1.98, RS: 0.034, BV: 50, IBV: 1e-5 } },
  { name: 'sig', type: 'D' as const, params: { IS: 4.352e-9, N: 1.906, RS: 0.6458, BV: 100, IBV: 1e-4 } },
  { name: 'npn', type: 'NPN' as const, params: { IS: 6.7e-15, BF: 200, BR: 0.74, VAF: 74, RB: 10, RC: 1 } },
  ledModel('red'),
];

const healthy: Element[] = [
  V('vpos', 'p_hdr', '0', 12),
  V('vneg', 'n_hdr', '0', -12),
  D('d1', 'p_hdr', 'p12', 'rect'),
  D('d2', 'n12', 'n_hdr', 'rect'),
  C('c1', 'p12', '0', 10e-6),
  V('vin', 'in', '0', 0.3),
  // input buffer
  R('r1', 'in', 'a_inv', 10e3),
  R('r2', 'a_inv', 'buf', 10e3),
  OPAMP('ua', '0', 'a_inv', 'buf', 'p12', 'n12'),
  // precision half-wave rectifier
  R('r3', 'buf', 'b_inv', 22e3),
  D('d3', 'b_out', 'b_inv', 'sig'),
  D('d4', 'hw', 'b_out', 'sig'),
  R('r4', 'hw', 'b_inv', 22e3),
  OPAMP('ub', '0', 'b_inv', 'b_out', 'p12', 'n12'),
  R('r5', 'hw', 'det', 10e3),
  C('c2', 'det', '0', 2.2e-6),
  R('r6', 'det', '0', 470e3),
  // comparator against a divider, driving an LED through a transistor
  R('r7', 'p12', 'thr', 100e3),
  R('r8', 'thr', '0', 4.7e3),
  OPAMP('uc', 'det', 'thr', 'c_out', 'p12', 'n12'),
  R('r9', 'c_out', 'q_b', 22e3),
  R('r10', 'q_b', '0', 10e3),
  Q('q1', 'led_k', 'q_b', '0', 'npn'),
  R('r11', 'p12', 'led_a', 1e3),
  D('led1', 'led_a', 'led_k', 'led_red'),
];

function faults(): Array<[string, Element[]]> {
  const out: Array<[string, Element[]]> = [];
  healthy.forEach((el, k) => {
    const swap = (make: (e: Element) => Element, what: string) => {
      const els = healthy.slice();
      els[k] = make(structuredClone(el));
      out.push([`${el.name} ${what}`, els]);
    };
    if (el.kind === 'resistor') {
      swap((e) => ({ ...e, value: 1e-3 }) as Element, 'shorted');
      swap((e) => ({ ...e, value: 1e9 }) as Element, 'open');
    }
    if (el.kind === 'diode') swap((e) => ({ ...e, nodes: [e.nodes[1], e.nodes[0]] }) as Element, 'reversed');
    if (el.kind === 'bjt') swap((e) => ({ ...e, nodes: [e.nodes[2], e.nodes[1], e.nodes[0]] }) as Element, 'collector and emitter swapped');
    if (el.kind === 'capacitor') swap((e) => ({ ...e, leakage: 1e-2 }) as Element, 'leaking');
    if (el.kind === 'opamp') swap((e) => ({ ...e, nodes: [e.nodes[0], e.nodes[1], e.nodes[2], `${e.name}_vp_open`, e.nodes[4]] }) as Element, 'V+ pin open');
  });
  return out;
}

describe('single-part faults of a rail-protected circuit', () => {
  it('the healthy circuit solves', () => {
    const s = solveDC(circuit(healthy, models));
    expect(s.nodes.p12).toBeGreaterThan(11);
    expect(s.nodes.p12).toBeLessThan(12);
  });

  it.each(faults())('%s', (_name, els) => {
    expectKclBalanced(circuit(els, models));
  });
});

describe('a transistor biased by picoamps through its base resistance', () => {
  it('settles (device-internal nodes carry no shunt of their own)', () => {
    const s = solveDC(
      circuit([V('vb', 'src', '0', -5), R('rbias', 'src', 'b', 47e3), V('vc', 'c', '0', 0), Q('q1', 'c', 'b', '0', 'npn')], models),
    );
    expect(s.nodes.b).toBeLessThan(-4.9);
    expect(s.junctions.q1).toBe('cutoff');
  });
});
