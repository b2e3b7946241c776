import { Worker } from 'node:worker_threads';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { buildDictionary, defaultCacheDir } from '../../diagnosis/index.js';
import { withSubstitutions } from '../../board/index.js';
import type { Board } from '../../schemas/board.js';
import { PACKAGE_ROOT } from '../../paths.js';

/**
 * The ranking at a walk's end needs the board's fault dictionary. It is built in a worker thread
 * as soon as a walk starts; once the worker has put it in the disk cache, `adopt` loads it into
 * this thread's memory, where the engine's ranking finds it. Until then the screens say they are
 * waiting instead of freezing.
 */
export type WarmupState = { state: 'working' } | { state: 'ready' } | { state: 'failed'; problem: string };

function diskCache() {
  const pkg = JSON.parse(readFileSync(join(PACKAGE_ROOT, 'package.json'), 'utf8')) as { version: string };
  return { dir: defaultCacheDir(process.env), version: pkg.version };
}

export function warmDictionary(board: Board, boardFile: string, substitutions: Record<string, string | number>, onDone: (s: WarmupState) => void): () => void {
  const here = import.meta.url;
  // From source (tests, tsx) the worker is TypeScript and needs the same loader; from dist it is plain JS.
  const fromSource = here.endsWith('.ts');
  const url = new URL(fromSource ? './dictionary-worker.ts' : './dictionary-worker.js', here);
  const cache = diskCache();
  const workerData = { boardFile, substitutions, diskCache: cache };
  const worker = fromSource
    ? // A worker does not inherit the TypeScript loader: register it in the worker, then load the module.
      new Worker(`import(${JSON.stringify(pathToFileURL(join(PACKAGE_ROOT, 'node_modules', 'tsx', 'dist', 'esm', 'api', 'index.mjs')).href)}).then((api) => { api.register(); return import(${JSON.stringify(url.href)}); });`, { eval: true, workerData })
    : new Worker(url, { workerData });
  let settled = false;
  const finish = (s: WarmupState) => {
    if (settled) return;
    settled = true;
    onDone(s);
  };
  worker.on('message', (m: { ok: boolean; problem?: string }) => {
    if (!m.ok) return finish({ state: 'failed', problem: m.problem ?? 'the fault dictionary could not be built' });
    try {
      const subject = Object.keys(substitutions).length ? withSubstitutions(board, substitutions) : board;
      buildDictionary(subject, { diskCache: cache });
      finish({ state: 'ready' });
    } catch (error) {
      finish({ state: 'failed', problem: (error as Error).message.split('\n')[0] });
    }
  });
  worker.on('error', (e) => finish({ state: 'failed', problem: e.message.split('\n')[0] }));
  worker.on('exit', (code) => finish(code === 0 ? { state: 'failed', problem: 'the dictionary worker ended without an answer' } : { state: 'failed', problem: `the dictionary worker stopped (code ${code})` }));
  // A person may quit before it finishes: the worker must not keep the process alive.
  worker.unref();
  return () => void worker.terminate();
}
