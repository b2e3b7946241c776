/**
 * Checks shared by the bundled-board tests: role targets of a fitting kind, ratings and LED currents
 * from one solution, and the ngspice comparison of a whole board under one condition.
 */
import { expect } from 'vitest';
import { buildCircuit, railSourceName, type BuiltCircuit } from '../../src/board/index.js';
import { solveDC, type DcSolution } from '../../src/circuit/index.js';
import type { Circuit } from '../../src/circuit/netlist.js';
import { spiceNodeNames, writeNetlist } from '../../src/circuit/spice/index.js';
import { PART_ROLES } from '../../src/schemas/roles.js';
import type { Board } from '../../src/schemas/board.js';
import { ngspiceOp } from '../reference/ngspice.js';

// kT/q at 27 °C, SPICE's nominal temperature (CODATA constants; REFERENCES.md).
export const VT = 0.025865;

/** Hand-analysis device laws from the models a board file declares. */
export function deviceLaws(board: Board) {
  const params = (model: string) => board.models[model].params;
  return {
    params,
    /** Shockley law with series resistance. */
    diodeVolts: (model: string, amps: number) => {
      const p = params(model);
      return (p.N ?? 1) * VT * Math.log(amps / p.IS + 1) + (p.RS ?? 0) * amps;
    },
    /** Base-emitter voltage at a collector current (NF = 1, Early effect left out). */
    vbe: (model: string, amps: number) => VT * Math.log(amps / params(model).IS + 1),
  };
}

/** A condition's setting for a control, else the part's default, else mid-track. */
export function settingOf(board: Board, condition: string, ref: string): number {
  const c = board.conditions.find((x) => x.id === condition)!;
  return (c.settings[ref] ?? board.parts.find((p) => p.ref === ref)!.position ?? 0.5) as number;
}

/** Part-role targets must be parts of a kind that can do the job. */
export function roleKindsFit(b: Board): void {
  const kinds: Partial<Record<keyof typeof PART_ROLES, string[]>> = {
    'pos-rail-protection': ['diode'], 'neg-rail-protection': ['diode'], 'rail-decoupling': ['capacitor', 'electrolytic'],
    'power-header': ['connector'], 'input-opamp': ['opamp-dual', 'opamp-quad'], 'input-gain-pot': ['pot'],
    'vca-transistors': ['npn', 'pnp'], 'vca-opamp': ['opamp-dual', 'opamp-quad'], 'sidechain-hp-switch': ['switch'],
    'sidechain-hp-capacitor': ['capacitor', 'electrolytic'], 'rectifier-diodes': ['diode'], 'rectifier-opamp': ['opamp-dual', 'opamp-quad'],
    'detector-capacitor': ['capacitor', 'electrolytic'], 'attack-resistor': ['resistor'], 'release-resistor': ['resistor'],
    'attack-pot': ['pot'], 'release-pot': ['pot'], 'threshold-pot': ['pot'], 'ratio-pot': ['pot'], 'control-opamp': ['opamp-dual', 'opamp-quad'],
    'gr-led': ['led'], 'gr-led-driver': ['npn', 'pnp'], 'gr-led-resistor': ['resistor'], 'meter-leds': ['led'],
    'meter-drivers': ['npn', 'pnp', 'opamp-dual', 'opamp-quad'], 'meter-resistors': ['resistor'], 'makeup-opamp': ['opamp-dual', 'opamp-quad'],
    'makeup-gain-pot': ['pot'], 'makeup-feedback-resistor': ['resistor'], 'makeup-input-resistor': ['resistor'],
  };
  for (const [role, refs] of Object.entries(b.roles.parts)) {
    for (const ref of refs ?? []) {
      const part = b.parts.find((p) => p.ref === ref)!;
      const allowed = kinds[role as keyof typeof PART_ROLES];
      if (allowed) expect(allowed, `${role} → ${ref}`).toContain(part.kind);
    }
  }
}

/** Ratings from the file (resistors, transistors, diodes) and LED currents, from one solution. */
export function withinRatings(b: Board, condition: string): void {
  const built: BuiltCircuit = buildCircuit(b, condition);
  const s: DcSolution = solveDC(built.circuit);
  for (const part of b.parts) {
    const names = built.partElements[part.ref] ?? [];
    const power = names.reduce((sum, n) => sum + Math.abs(s.elements[n]?.power ?? 0), 0);
    if (part.powerRating !== undefined) expect(power, `${condition} ${part.ref}`).toBeLessThan(part.powerRating);
    if (part.kind === 'led') {
      const current = Math.abs(s.elements[names[0]].current);
      // Dark (under 0.1 mA) or lit at 2–15 mA (common practice for 3 mm indicator LEDs, 20 mA absolute maximum).
      const ok = current < 1e-4 || (current >= 2e-3 && current <= 15e-3);
      expect(ok, `${condition} ${part.ref} at ${(current * 1e3).toFixed(2)} mA`).toBe(true);
    }
  }
}

/**
 * ngspice on the project's own SPICE form of the built circuit, with the rails held at the voltages
 * our solver found behind the protection diodes (the diode drop itself is checked by hand above):
 * every voltage test point must agree.
 */
export async function matchesNgspice(b: Board, condition: string): Promise<void> {
  const built = buildCircuit(b, condition);
  const full = solveDC(built.circuit);
  const protection = new Set([...(b.roles.parts['pos-rail-protection'] ?? []), ...(b.roles.parts['neg-rail-protection'] ?? [])].flatMap((ref) => built.partElements[ref]));
  const railSources = new Set(b.rails.map((r) => railSourceName(r.id)));
  const railNets = [b.testPoints.find((t) => t.id === b.roles.testPoints['pos-rail'])!.net, b.testPoints.find((t) => t.id === b.roles.testPoints['neg-rail'])!.net];
  const held: Circuit = {
    ...built.circuit,
    elements: [
      ...built.circuit.elements.filter((e) => !protection.has(e.name) && !railSources.has(e.name)),
      ...railNets.map((net, i) => ({ kind: 'vsource' as const, name: `vheld${i}`, nodes: [built.netNode(net), '0'] as [string, string], dc: full.nodes[built.netNode(net)] })),
    ],
  };
  const ours = solveDC(held, { initial: full });
  const ref = await ngspiceOp(writeNetlist(held));
  const names = spiceNodeNames(held);
  for (const tp of b.testPoints.filter((t) => t.quantity === 'voltage')) {
    const node = built.netNode(tp.net);
    const theirs = ref.nodes[names.get(node)!];
    expect(theirs, `${condition} ${tp.id}`).toBeDefined();
    expect(Math.abs(ours.nodes[node] - theirs), `${condition} ${tp.id}`).toBeLessThan(1e-3);
    expect(Math.abs(full.nodes[node] - theirs), `${condition} ${tp.id} (full board)`).toBeLessThan(1e-3);
  }
}
