import type { Wording } from '../../schemas/tree.js';

/** Which register the walk speaks in: to a bench technician, or to a customer over chat. */
export type Wordings = keyof Wording;

export function say(wording: Wording, mode: Wordings): string {
  return wording[mode];
}
