/** Checks on element values at compile time, so a bad value is reported as the user's mistake, by name. */
import { UserInputError } from '../errors.js';

export function badValue(element: string, field: string, found: unknown, accepted: string): UserInputError {
  return new UserInputError({
    code: 'circuit.bad-value',
    path: `elements.${element}.${field}`,
    message: `${field} of ${element} is ${String(found)}`,
    accepted,
  });
}

/** A finite number ≥ min (or > min when `strict`). */
export function requireNumber(element: string, field: string, value: unknown, min = -Infinity, strict = false): number {
  const ok =
    typeof value === 'number' && Number.isFinite(value) && (strict ? value > min : value >= min);
  if (!ok) {
    const accepted =
      min === -Infinity ? 'a finite number' : `a finite number ${strict ? '>' : '≥'} ${min}`;
    throw badValue(element, field, value, accepted);
  }
  return value as number;
}
