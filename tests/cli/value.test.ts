import { describe, expect, it } from 'vitest';
import { run } from '../../src/cli/run.js';
import { memoryIo } from '../../src/cli/io.js';

describe('voltwalk value', () => {
  it('prints the value, E-series neighbours and the bands (IEC 60062, IEC 60063)', async () => {
    const io = memoryIo();
    expect(await run(['value', '4k6'], io)).toBe(0);
    expect(io.out()).toContain('4.6 k');
    expect(io.out()).toMatch(/E12 +nearest 4.7 k \(between 3.9 k and 4.7 k\)/);
    // IEC 60063 E96 holds 453 and 464 around 460.
    expect(io.out()).toMatch(/E96 +nearest 4.64 k \(between 4.53 k and 4.64 k\)/);
    expect(io.out()).toContain('bands yellow blue red gold');
  });

  it('decodes colour bands (IEC 60062: yellow violet red gold = 4.7 kΩ ±5 %)', async () => {
    const io = memoryIo();
    expect(await run(['value', '--json', 'yellow', 'violet', 'red', 'gold'], io)).toBe(0);
    const r = JSON.parse(io.out());
    expect(r).toMatchObject({ value: 4700, unit: 'Ω', tolerance: 0.05, source: 'bands', bands: ['yellow', 'violet', 'red', 'gold'] });
    expect(r.preferred.E12.isPreferred).toBe(true);
  });

  it('refuses garbage in one line with the accepted forms, exit 1', async () => {
    const io = memoryIo();
    expect(await run(['value', '4k7k'], io)).toBe(1);
    expect(io.err().trim().split('\n')).toHaveLength(1);
    expect(io.err()).toMatch(/TEXT: "4k7k" is not a value: more than one multiplier letter \(accepted: /);
  });

  it('usage error without TEXT, exit 2', async () => {
    const io = memoryIo();
    expect(await run(['value'], io)).toBe(2);
    expect(io.err()).toContain('value needs TEXT');
  });
});
