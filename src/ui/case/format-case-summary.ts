import { bandFigures, formatBand, formatReading } from '../../units/index.js';
import type { CaseSummary } from './case-summary.js';
import { FAULT_PRESENT_NOTE } from '../../engine/fault-present-note.js';

/**
 * The case as text short enough to paste into a support chat: at most about 25 lines, however
 * long the walk. Markdown marks only what a chat renders well (bold, lists); `text` drops them.
 */
export type SummaryStyle = 'md' | 'text';

const MAX_READINGS = 8;
const MAX_SUSPECTS = 4;
const MAX_ANSWERS = 3;

const OUTCOME_WORD: Record<string, string> = { 'in-band': 'ok', low: 'LOW', high: 'HIGH', 'stuck-at-rail': 'AT RAIL', 'near-zero': 'ZERO' };

export function formatCaseSummary(c: CaseSummary, style: SummaryStyle = 'md'): string {
  const b = (s: string) => (style === 'md' ? `**${s}**` : s);
  const lines: string[] = [];
  lines.push(style === 'md' ? `### voltwalk case: ${c.tree.symptom}` : `voltwalk case: ${c.tree.symptom}`);
  lines.push(`Board: ${c.board.name} (${c.board.id}) · walk ${c.finished ? 'finished' : 'not finished'}`);
  lines.push(
    c.substitutions.length > 0
      ? `Parts changed: ${c.substitutions.map((s) => `${s.ref} ${s.was ?? '?'} -> ${s.value}`).join(', ')}`
      : 'Parts changed: none (kit values)',
  );
  if (c.readings.length > 0) {
    lines.push('Readings (healthy band in brackets):');
    for (const r of c.readings.slice(0, MAX_READINGS)) {
      const word = OUTCOME_WORD[r.outcome] ?? r.outcome;
      // The figures that keep the band's edges apart, for the reading too: against 11.74 V to 11.80 V,
      // "11.8 V ok [11.7 V to 11.8 V]" would say nothing.
      const band = formatBand(r.min, r.max, r.nominal, r.unit);
      lines.push(`- ${r.testPoint} ${r.label}, ${r.condition}: ${formatReading(r.value, r.unit, bandFigures(r.min, r.max))} ${r.outcome === 'in-band' ? word : b(word)} [${band.min} to ${band.max}]`);
    }
    if (c.readings.length > MAX_READINGS) lines.push(`- … and ${c.readings.length - MAX_READINGS} more`);
  } else lines.push('Readings: none yet');
  if (c.answers.length > 0) lines.push(`Checks answered: ${c.answers.length}`);
  for (const a of c.answers.slice(-MAX_ANSWERS)) lines.push(`- ${a.question} -> ${a.answer}`);
  if (c.skipped.length > 0) lines.push(`Skipped: ${c.skipped.length} step(s) (${c.skipped[0].reason}${c.skipped.length > 1 ? ', …' : ''})`);
  if (c.conclusion) lines.push(`${b('Found')}: ${c.conclusion.title}`);
  for (const u of c.unexplained) lines.push(`Note: ${clip(u, 240)}`);
  if (c.suspects.length > 0) {
    lines.push(`Suspects (most likely first${c.conclusion?.faultPresent ? `; ${FAULT_PRESENT_NOTE}` : ''}):`);
    for (const s of c.suspects.slice(0, MAX_SUSPECTS)) {
      const who = s.faults.length > 1 ? `${listFaults(s.faults)} (cannot tell apart yet)` : s.faults.join(', ');
      lines.push(`${s.rank}. ${who}, ${percent(s.probability)} — ${clip(s.why, 90)}${s.where.length ? ` (${clip(s.where.join('; '), 40)})` : ''}`);
    }
  }
  if (c.waitingAt) lines.push(`Walk waits at: ${clip(c.waitingAt.prompt, 120)}`);
  if (c.next) {
    lines.push(`Next: measure ${c.next.testPoint} (${c.next.label}) under "${c.next.conditionLabel}".`);
    lines.push(`${c.wording === 'customer' ? 'Ask the customer' : 'Ask'}: "${clip(c.next.question, 300)}"`);
  }
  return `${lines.join('\n')}\n`;
}

/** A group the readings cannot split may hold many faults; a chat line names the first few. */
export function listFaults(faults: string[], shown = 3): string {
  const head = faults.slice(0, shown).join(' or ');
  return faults.length > shown ? `${head} or ${faults.length - shown} more` : head;
}

function percent(p: number): string {
  return `${Math.round(p * 100)} %`;
}

function clip(text: string, max: number): string {
  return text.length <= max ? text : `${text.slice(0, max - 1)}…`;
}
