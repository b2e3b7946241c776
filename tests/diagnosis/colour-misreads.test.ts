import { describe, expect, it } from 'vitest';
import { colourMisreads } from '../../src/diagnosis/colour-misreads.js';

// IEC 60062 colour code: 4k7 ±5 % is yellow violet red gold.
describe('colour-band misreads', () => {
  it('4k7 5 %: a neighbouring colour in each band', () => {
    const values = colourMisreads(4700, 0.05).map((m) => m.value).sort((a, b) => a - b);
    // yellow→orange 3k7, yellow→green 5k7, violet→blue 4k6, violet→grey 4k8, red→brown 470 Ω, red→orange 47 kΩ
    expect(values).toEqual([470, 3700, 4600, 4800, 5700, 47000]);
  });

  it('4R7 5 % (yellow violet gold gold): gold read as silver in the multiplier gives 0.47 Ω', () => {
    const m = colourMisreads(4.7, 0.05).find((x) => x.meant === 'gold' && x.read === 'silver');
    expect(m?.value).toBeCloseTo(0.47, 12);
  });

  it('10k 1 % (brown black black red brown): a first band never reads black', () => {
    const values = colourMisreads(10000, 0.01).map((m) => m.value).sort((a, b) => a - b);
    // brown→red 20k; black→brown in band 2 gives 11k, in band 3 10.1k; red→brown 1k, red→orange 100k
    expect(values).toEqual([1000, 10100, 11000, 20000, 100000]);
  });
});
