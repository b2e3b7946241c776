import { GROUND, type Element } from '../circuit/netlist.js';

/**
 * A net that only capacitors, current sources or open switch contacts reach has no DC path to ground,
 * so its voltage is undefined and the DC matrix singular (ngspice stops on the same circuit). Real
 * boards settle such nets through leakage; we tie each isolated group to ground through TIE_OHMS.
 *
 * Junctions do not count as a path here: a net reached only through a reverse-biased diode sits on
 * the diode's saturation current alone, which Newton cannot place (the solver fails to converge with
 * ties of 10 GΩ and above on a reverse 1N4148 into such a net; 1 GΩ converges in ≈20 iterations).
 * 1 GΩ is ten times the ohmmeter's overload threshold, so a tied net reads as open; in parallel with a real
 * path it shifts a 1 MΩ reading by 0.1 % and a 100 kΩ one by 0.01 %. Powered, it leaks ≈12 nA at most.
 */
export const TIE_OHMS = 1e9;
export const tieName = (i: number) => `rtie_${i}`;

/** Terminals each element joins firmly at DC. An op-amp output is driven from inside the part (towards ground). */
function dcJoins(el: Element): string[][] {
  switch (el.kind) {
    case 'resistor':
    case 'inductor':
    case 'vsource':
    case 'pot':
      return [el.nodes];
    case 'vcvs':
      return [[el.nodes[0], el.nodes[1]]];
    case 'opamp':
      return [[el.nodes[0], el.nodes[1]], [el.nodes[2], GROUND]];
    case 'switch':
      return (el.positions[el.position] ?? []).map(([a, b]) => [el.nodes[a], el.nodes[b]]);
    case 'diode':
    case 'bjt':
    case 'capacitor':
    case 'isource':
    case 'vccs':
      return [];
  }
}

/** Appends a tie resistor for every group of nodes with no DC path to ground; returns how many. */
export function tieFloatingNodes(elements: Element[]): number {
  const parent = new Map<string, string>();
  const find = (n: string): string => {
    let root = n;
    while (parent.get(root) !== root) {
      if (!parent.has(root)) parent.set(root, root);
      else root = parent.get(root)!;
    }
    let cur = n;
    while (cur !== root) {
      const next = parent.get(cur)!;
      parent.set(cur, root);
      cur = next;
    }
    return root;
  };
  const union = (a: string, b: string) => {
    const ra = find(a);
    const rb = find(b);
    if (ra !== rb) parent.set(ra, rb);
  };
  find(GROUND);
  for (const el of elements) {
    for (const n of el.nodes) find(n);
    for (const group of dcJoins(el)) for (let i = 1; i < group.length; i++) union(group[0], group[i]);
  }
  const tied = new Set<string>();
  let count = 0;
  for (const n of [...parent.keys()]) {
    const root = find(n);
    if (root === find(GROUND) || tied.has(root)) continue;
    tied.add(root);
    elements.push({ kind: 'resistor', name: tieName(++count), nodes: [n, GROUND], value: TIE_OHMS });
  }
  return count;
}
