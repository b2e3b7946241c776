/**
 * `npm run bench`: each area of voltwalk has its own benchmark module here; this runs them in turn.
 * Machines are noisy, so every module reports medians and ratios, never a single timing, and
 * nothing here asserts: the numbers go in the README's performance section.
 * `npm run bench -- solver` runs only the named module(s).
 */
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { dirname, join } from 'node:path';

const MODULES = ['solver', 'montecarlo', 'dictionary', 'engine', 'startup'];
const here = dirname(fileURLToPath(import.meta.url));
const wanted = process.argv.slice(2).filter((a) => !a.startsWith('-'));

console.log(`voltwalk bench — node ${process.version}, ${process.platform}/${process.arch}`);
for (const name of MODULES) {
  if (wanted.length > 0 && !wanted.includes(name)) continue;
  const file = join(here, `${name}.ts`);
  if (!existsSync(file)) continue;
  console.log(`\n## ${name}`);
  const mod = (await import(`./${name}.ts`)) as { run: () => Promise<void> };
  await mod.run();
}
