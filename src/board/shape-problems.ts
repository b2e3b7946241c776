import type { z } from 'zod';
import type { Problem } from '../errors.js';

/**
 * Turns zod's shape issues into Problems a person can act on: the path as written in the file
 * (`parts[12].value`), what was found, and the accepted form — with a "did you mean" for a misspelt
 * key or option, since that is the usual cause.
 */

type Issue = z.core.$ZodIssue;
type AnySchema = { _zod: { def: Record<string, unknown> & { type: string } } };

export function formatPath(path: ReadonlyArray<PropertyKey>): string {
  let out = '';
  for (const key of path) {
    if (typeof key === 'number') out += `[${key}]`;
    else out += out === '' ? String(key) : `.${String(key)}`;
  }
  return out;
}

/** The schema that governs `path`, found by walking objects, arrays, records and wrappers. */
function schemaAt(root: unknown, path: ReadonlyArray<PropertyKey>): AnySchema | undefined {
  let s = unwrap(root as AnySchema);
  for (const key of path) {
    if (!s) return undefined;
    const def = s._zod.def;
    if (def.type === 'object') s = unwrap((def.shape as Record<string, AnySchema>)[String(key)]);
    else if (def.type === 'array') s = unwrap(def.element as AnySchema);
    else if (def.type === 'record') s = unwrap(def.valueType as AnySchema);
    else return undefined;
  }
  return s;
}

function unwrap(s: AnySchema | undefined): AnySchema | undefined {
  let cur = s;
  while (cur && ['default', 'optional', 'nullable', 'prefault', 'readonly'].includes(cur._zod.def.type)) {
    cur = cur._zod.def.innerType as AnySchema;
  }
  return cur;
}

/** Keys an object or (partial) enum-keyed record at `path` accepts. */
function acceptedKeys(root: unknown, path: ReadonlyArray<PropertyKey>): string[] {
  const s = schemaAt(root, path);
  if (!s) return [];
  const def = s._zod.def;
  if (def.type === 'object') return Object.keys(def.shape as object);
  if (def.type === 'record') {
    const key = unwrap(def.keyType as AnySchema);
    if (key?._zod.def.type === 'enum') return Object.values(key._zod.def.entries as Record<string, string>);
  }
  return [];
}

function editDistance(a: string, b: string): number {
  const row = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    let prev = row[0];
    row[0] = i;
    for (let j = 1; j <= b.length; j++) {
      const cur = row[j];
      row[j] = Math.min(row[j] + 1, row[j - 1] + 1, prev + (a[i - 1] === b[j - 1] ? 0 : 1));
      prev = cur;
    }
  }
  return row[b.length];
}

/** The closest candidate when it is close enough to be a typo. */
export function closest(word: string, candidates: readonly string[]): string | undefined {
  let best: string | undefined;
  let bestD = Infinity;
  for (const c of candidates) {
    const d = editDistance(word.toLowerCase(), c.toLowerCase());
    if (d < bestD) [best, bestD] = [c, d];
  }
  return best !== undefined && bestD <= Math.max(2, Math.floor(word.length / 3)) ? best : undefined;
}

export function didYouMean(word: string, candidates: readonly string[]): string {
  const c = closest(word, candidates);
  return c ? ` — did you mean "${c}"?` : '';
}

function found(value: unknown): string {
  if (value === undefined) return 'nothing';
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'a list';
  if (typeof value === 'object') return 'an object';
  const text = JSON.stringify(value);
  return `${typeof value} ${text.length > 40 ? `${text.slice(0, 37)}…` : text}`;
}

function valueAt(raw: unknown, path: ReadonlyArray<PropertyKey>): unknown {
  let cur: unknown = raw;
  for (const key of path) {
    if (cur === null || typeof cur !== 'object') return undefined;
    cur = (cur as Record<PropertyKey, unknown>)[key as string];
  }
  return cur;
}

const quoteList = (xs: readonly unknown[]) => xs.map((x) => JSON.stringify(x)).join(', ');
const article = (word: string) => `${/^[aeiou]/i.test(word) ? 'an' : 'a'} ${word}`;

/** One Problem per issue (one per unknown key), in the file's terms. */
export function shapeProblems(issues: readonly Issue[], raw: unknown, root: unknown, file: string, prefix = 'board'): Problem[] {
  const problems: Problem[] = [];
  for (const issue of issues) {
    const path = formatPath(issue.path);
    const at = valueAt(raw, issue.path);
    const base = { file, path: path || undefined };
    switch (issue.code) {
      case 'unrecognized_keys': {
        const keys = acceptedKeys(root, issue.path);
        for (const key of issue.keys) {
          problems.push({
            ...base,
            code: `${prefix}.unknown-key`,
            path: formatPath([...issue.path, key]),
            message: `unknown key "${key}"${didYouMean(key, keys)}`,
            accepted: keys.length ? `keys ${keys.join(', ')}` : undefined,
          });
        }
        break;
      }
      case 'invalid_value': {
        const values = issue.values.map(String);
        problems.push({
          ...base,
          code: `${prefix}.invalid-value`,
          message: `found ${found(at)}${typeof at === 'string' ? didYouMean(at, values) : ''}`,
          accepted: values.length === 1 ? JSON.stringify(issue.values[0]) : `one of ${quoteList(issue.values)}`,
        });
        break;
      }
      case 'invalid_type': {
        const missing = at === undefined;
        problems.push({
          ...base,
          code: missing ? `${prefix}.missing` : `${prefix}.wrong-type`,
          message: missing ? 'required but missing' : `found ${found(at)}`,
          accepted: article(issue.expected),
        });
        break;
      }
      case 'invalid_union': {
        const expected = issue.errors
          .flat()
          .filter((e) => e.code === 'invalid_type')
          .map((e) => (e as { expected: string }).expected);
        const deeper = issue.errors.flat().filter((e) => e.code !== 'invalid_type');
        if (deeper.length > 0 && expected.length < issue.errors.length) {
          problems.push(...shapeProblems(deeper.map((e) => ({ ...e, path: [...issue.path, ...e.path] })) as Issue[], raw, root, file, prefix));
        } else {
          problems.push({ ...base, code: `${prefix}.wrong-type`, message: `found ${found(at)}`, accepted: [...new Set(expected)].map(article).join(' or ') });
        }
        break;
      }
      case 'invalid_format':
        problems.push({ ...base, code: `${prefix}.bad-format`, message: `found ${found(at)}`, accepted: issue.message.startsWith('Invalid') ? `text matching ${String((issue as { pattern?: unknown }).pattern ?? issue.format)}` : issue.message });
        break;
      case 'too_small':
      case 'too_big': {
        const bound = issue.code === 'too_small' ? issue.minimum : issue.maximum;
        const op = issue.code === 'too_small' ? (issue.inclusive ? '≥' : '>') : issue.inclusive ? '≤' : '<';
        const what = issue.origin === 'array' ? `a list with ${op} ${bound} item(s)` : issue.origin === 'string' ? `text of length ${op} ${bound}` : `a number ${op} ${bound}`;
        problems.push({ ...base, code: `${prefix}.out-of-range`, message: `found ${found(at)}`, accepted: what });
        break;
      }
      default:
        problems.push({ ...base, code: `${prefix}.invalid`, message: issue.message });
    }
  }
  return problems;
}
