import { describe, expect, it } from 'vitest';
import { parseNetlist } from '../../../src/circuit/spice/parse-netlist.js';
import { UserInputError } from '../../../src/errors.js';

// Netlist syntax follows SPICE's conventions as the ngspice user manual describes them (title
// first line, `*` and `;` comments, `+` continuation, first letter picks the element) — from
// memory; tests/reference/cross-check.test.ts runs the same files through ngspice itself.

function problemsOf(text: string): string[] {
  try {
    parseNetlist(text, 'x.cir');
  } catch (error) {
    expect(error).toBeInstanceOf(UserInputError);
    return (error as UserInputError).problems.map((p) => `${p.path}: ${p.message}${p.accepted ? ` [${p.accepted}]` : ''}`);
  }
  throw new Error('expected the netlist to be refused');
}

describe('parseNetlist', () => {
  it('reads every supported element, comments, continuations, case and gnd', () => {
    const { circuit, warnings, analyses } = parseNetlist(
      [
        '* this first line is the title, even though it starts with a star',
        'V1 VCC 0 DC 12 ; inline comment',
        'Vin in GND dc 0 ac 1 45',
        'I1 0 bias 1mA',
        '* a full-line comment',
        'R1 VCC Out 4.7k',
        '+ $ a continuation carrying only a comment',
        'R2 out',
        '+ 0',
        '+ 10kohm',
        'C1 in base 100nF ic=0',
        'L1 out x 10mH',
        'Rx x 0 1meg',
        'D1 out led LEDRED 2',
        'Q1 out base e1 BC547',
        'Q2 out base e1 0 BC547 1.5',
        'E1 amp 0 in 0 10',
        'G1 0 amp in 0 1m',
        'Ramp amp 0 1k',
        'Re e1 0 1k',
        'Rled led 0 1k',
        'Rb base 0 10k',
        'Rbias bias 0 1k',
        '.model LEDRED D(IS=1e-20 N=1.8',
        '+ RS=2)',
        '.model BC547 npn bf=300, is=1.8e-14 vaf=80',
        '.op',
        '.ac dec 10 10 100k',
        '.temp 40',
        '.end',
        'R99 this is after the end and ignored',
      ].join('\n'),
    );
    expect(circuit.title).toBe('* this first line is the title, even though it starts with a star');
    expect(circuit.temperatureC).toBe(40);
    const byName = Object.fromEntries(circuit.elements.map((e) => [e.name, e]));
    expect(byName.v1).toEqual({ kind: 'vsource', name: 'v1', nodes: ['vcc', '0'], dc: 12 });
    expect(byName.vin).toEqual({ kind: 'vsource', name: 'vin', nodes: ['in', '0'], dc: 0, ac: { mag: 1, phaseDeg: 45 } });
    expect(byName.i1).toEqual({ kind: 'isource', name: 'i1', nodes: ['0', 'bias'], dc: 1e-3 });
    expect(byName.r1).toEqual({ kind: 'resistor', name: 'r1', nodes: ['vcc', 'out'], value: 4700 });
    expect(byName.r2).toEqual({ kind: 'resistor', name: 'r2', nodes: ['out', '0'], value: 10e3 });
    expect(byName.c1).toEqual({ kind: 'capacitor', name: 'c1', nodes: ['in', 'base'], value: 100e-9 });
    expect(byName.l1).toEqual({ kind: 'inductor', name: 'l1', nodes: ['out', 'x'], value: 10e-3 });
    expect(byName.rx).toMatchObject({ value: 1e6 });
    expect(byName.d1).toEqual({ kind: 'diode', name: 'd1', nodes: ['out', 'led'], model: 'ledred', area: 2 });
    expect(byName.q1).toEqual({ kind: 'bjt', name: 'q1', nodes: ['out', 'base', 'e1'], model: 'bc547' });
    expect(byName.q2).toEqual({ kind: 'bjt', name: 'q2', nodes: ['out', 'base', 'e1'], model: 'bc547', area: 1.5 });
    expect(byName.e1).toEqual({ kind: 'vcvs', name: 'e1', nodes: ['amp', '0', 'in', '0'], gain: 10 });
    expect(byName.g1).toEqual({ kind: 'vccs', name: 'g1', nodes: ['0', 'amp', 'in', '0'], gm: 1e-3 });
    expect(circuit.models).toEqual({
      ledred: { name: 'ledred', type: 'D', params: { IS: 1e-20, N: 1.8, RS: 2 } },
      bc547: { name: 'bc547', type: 'NPN', params: { BF: 300, IS: 1.8e-14, VAF: 80 } },
    });
    expect(analyses).toEqual([{ kind: 'op' }, { kind: 'ac', sweep: 'dec', points: 10, start: 10, stop: 100e3 }]);
    expect(warnings.some((w) => /line 11: c1: ic=/.test(w))).toBe(true);
    expect(warnings.some((w) => /after \.end/.test(w))).toBe(true);
  });

  it('warns that 1M on a resistor is one milliohm, and about letter-code values SPICE misreads', () => {
    const { circuit, warnings } = parseNetlist('t\nr1 a 0 1M\nr2 a 0 4k7\nv1 a 0 1\n.end\n');
    expect(circuit.elements[0]).toMatchObject({ value: 1e-3 });
    expect(circuit.elements[1]).toMatchObject({ value: 4e3 });
    expect(warnings.find((w) => w.includes('line 2'))).toMatch(/milli.*1meg/);
    expect(warnings.find((w) => w.includes('line 3'))).toMatch(/4\.7k/);
  });

  it('reads a .model card with a bare parameter list and one split over lines', () => {
    const { circuit } = parseNetlist('t\nd1 a 0 dz\nv1 a 0 1\n.model dz D IS = 1e-14 BV=5.1\n+ IBV=1m\n.end');
    expect(circuit.models.dz.params).toEqual({ IS: 1e-14, BV: 5.1, IBV: 1e-3 });
  });

  it('reads the op-amp instance form from a built-in model or from full parameters', () => {
    const { circuit } = parseNetlist(
      [
        't',
        'XU1A inp inn out vp vn TL072 gain=1e5',
        'xu2 inp inn o2 vp vn opamp gain=1e6 rout=50 rin=1e12 headroom=1 iq=1m vos=0 en=10n in=1f',
        'v1 vp 0 12',
        '.end',
      ].join('\n'),
    );
    expect(circuit.elements[0]).toMatchObject({ kind: 'opamp', name: 'xu1a', nodes: ['inp', 'inn', 'out', 'vp', 'vn'], params: { gain: 1e5, headroom: 1.5 } });
    expect(circuit.elements[1]).toMatchObject({ kind: 'opamp', params: { gain: 1e6, rout: 50, iq: 1e-3, en: 10e-9, in: 1e-15 } });
  });

  it('names the line and the accepted letters for an unsupported element', () => {
    expect(problemsOf('t\nv1 a 0 1\nr1 a 0 1k\nM1 d g s s nmos\n.end')).toEqual([
      'line 4: "M1": element letter M is not supported [R, C, L, V, I, D, Q, E, G, and X for the op-amp form]',
    ]);
  });

  it('lists every problem at once, each with its line', () => {
    const problems = problemsOf(
      ['t', 'r1 a 0 abc', 'r1 a 0 1k', 'r1 a 0 2k', 'd1 a 0 nomodel', '.include other.lib', 'v1 a 0 sin(0 1 1k)', 'xu1 a b c d e f', 'r9 a 0 0', '.end'].join('\n'),
    );
    expect(problems).toHaveLength(7);
    expect(problems[0]).toMatch(/^line 2: r1 value "abc" is not a SPICE number/);
    expect(problems[1]).toMatch(/^line 4: element r1 is defined twice \(first on line 3\)/);
    expect(problems[2]).toMatch(/^line 5: d1: model nomodel has no \.model card/);
    expect(problems[3]).toMatch(/^line 6: \.include is not supported/);
    expect(problems[4]).toMatch(/^line 7: v1: source functions/);
    expect(problems[5]).toMatch(/^line 8: xu1: subcircuit f is not an op-amp model/);
    expect(problems[6]).toMatch(/^line 9: r9: resistance 0 must be above zero/);
  });

  it('refuses a model of the wrong kind, an unknown model type and an empty netlist', () => {
    expect(problemsOf('t\nq1 c b 0 dm\n.model dm D\n.end')[0]).toMatch(/q1: model dm is a D model/);
    expect(problemsOf('t\nm1 d g 0 0 nm\n.model nm NMOS\n.end')[0]).toMatch(/type NMOS is not supported \[D, NPN, PNP\]/);
    expect(problemsOf('just a title\n.end')[0]).toMatch(/no elements/);
  });

  it('names the file in every problem', () => {
    try {
      parseNetlist('t\nz1 a b\n', 'board.cir');
      expect.unreachable();
    } catch (error) {
      expect((error as UserInputError).message).toMatch(/^board\.cir: line 2: /);
    }
  });

  it('restores annotated elements and renamed nodes', () => {
    const { circuit } = parseNetlist(
      [
        't',
        '*@node n_p12v +12v',
        'v1 n_p12v 0 12',
        '*@element {"kind":"pot","name":"rv1","nodes":["+12v","w","0"],"value":100000,"position":0.25,"taper":"log"}',
        'rrv1_aw n_p12v w 1234',
        'rrv1_wb w 0 5678',
        '*@end',
        '.end',
      ].join('\n'),
    );
    expect(circuit.elements).toEqual([
      { kind: 'vsource', name: 'v1', nodes: ['+12v', '0'], dc: 12 },
      { kind: 'pot', name: 'rv1', nodes: ['+12v', 'w', '0'], value: 100000, position: 0.25, taper: 'log' },
    ]);
  });

  it('refuses a damaged annotation with its line', () => {
    expect(problemsOf('t\nv1 a 0 1\n*@element {"kind":"pot","name":"rv1"}\nr1 a 0 1\n*@end\n.end')[0]).toMatch(/^line 3: the \*@element annotation is not a circuit element at nodes/);
    expect(problemsOf('t\nv1 a 0 1\n*@element {"kind":"pot"\n*@end\n.end')[0]).toMatch(/^line 3: .*not valid JSON/);
  });
});
