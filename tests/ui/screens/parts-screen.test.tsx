import React, { useState } from 'react';
import { describe, expect, it } from 'vitest';
import { render } from 'ink-testing-library';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { PartsScreen } from '../../../src/ui/screens/PartsScreen.js';
import * as services from '../../../src/ui/app/services.js';
import { DEMO_BOARD_FILE, loadBoard } from '../../../src/board/index.js';
import { ARROW_DOWN, ENTER, press, settle } from '../keys.js';

const board = loadBoard(DEMO_BOARD_FILE);

function Harness({ cwd, seen }: { cwd: string; seen: Array<Record<string, string | number>> }) {
  const [subs, setSubs] = useState<Record<string, string | number>>({});
  return (
    <PartsScreen
      width={80}
      board={board}
      substitutions={subs}
      services={services}
      cwd={cwd}
      onChange={(s) => {
        seen.push(s);
        setSubs(s);
      }}
      onBack={() => {}}
    />
  );
}

const ARROW_RIGHT = '\u001B[C';

describe('part values screen', () => {
  it('lists a stage with values, tolerance and colour bands; a changed value is checked while typed', async () => {
    const seen: Array<Record<string, string | number>> = [];
    const r = render(<Harness cwd={tmpdir()} seen={seen} />);
    await press(r.stdin, ARROW_RIGHT, ARROW_DOWN);
    let frame = r.lastFrame()!;
    expect(frame).toContain('Input stage (2 of');
    // IEC 60062: 22 kΩ ±1 % in five bands is red red black red brown.
    expect(frame).toContain('> R1 · 22 kΩ ±1 % · bands red-red-black-red-brown · below J2');
    await press(r.stdin, ENTER, '2', '7', 'x');
    frame = r.lastFrame()!;
    expect(frame).toContain('New value for R1: 27x_');
    expect(frame).toMatch(/^! .*accepted/m);
    await press(r.stdin, '\u007F', 'k', ENTER);
    expect(seen.at(-1)).toEqual({ R1: '27k' });
    frame = r.lastFrame()!;
    // IEC 60062: 27 kΩ ±1 % is red violet black red brown.
    expect(frame).toContain('> R1 · 27 kΩ ±1 % · bands red-violet-black-red-brown');
    expect(frame).toContain('· changed, kit 22k ·');
    expect(frame).toContain('R1 = 27k; expected bands are worked out from it');
    await press(r.stdin, 'r');
    expect(seen.at(-1)).toEqual({});
  });

  it('imports a bill of materials: values that differ become substitutions, parts without values are named', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'voltwalk-bom-'));
    writeFileSync(join(dir, 'bom.csv'), 'Designator,Value,Footprint\n"R1",27k,0805\nR2,18k,0805\nJ2,jack,\n');
    const seen: Array<Record<string, string | number>> = [];
    const r = render(<Harness cwd={dir} seen={seen} />);
    await settle(500);
    await press(r.stdin, 'i', 'bom.csv', ENTER);
    expect(seen.at(-1)).toEqual({ R1: '27k' });
    expect(r.lastFrame()).toContain('imported 1 changed value(s); ignored, no value or not on board: J2');
  });

  it('refuses a bill of materials without the two columns, naming what it needs', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'voltwalk-bom-'));
    writeFileSync(join(dir, 'bad.csv'), 'Part,Qty\nR1,2\n');
    const r = render(<Harness cwd={dir} seen={[]} />);
    await settle(500);
    await press(r.stdin, 'i', 'bad.csv', ENTER);
    expect(r.lastFrame()).toMatch(/^! line 1: no header row with both a designator and a value column/m);
  });
});
