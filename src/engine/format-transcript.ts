import type { Transcript, TranscriptEntry } from './transcript.js';
import { showValue, type PartView, type WalkStep } from './step-view.js';
import { faultLabel, groupMembersText } from '../diagnosis/index.js';
import { FAULT_PRESENT_NOTE } from './fault-present-note.js';

const percent = (p: number) => `${(p * 100).toFixed(0)} %`;

export type Wording = 'technician' | 'customer';

/** One line per detail of a step: what was asked, the band, the reading, the outcome. */
function entryLines(e: TranscriptEntry, n: number, wording: Wording): string[] {
  const where = e.testPoint ? ` at ${e.testPoint.id} (${e.testPoint.label})` : '';
  const under = e.condition ? `, ${e.condition.label}` : '';
  const lines = [`${String(n).padStart(2)}. [${e.node}] ${e.kind}${where}${under}`, `    ${e.say[wording]}`];
  // Someone who does not know the test point names needs the board's own words for where the probes go.
  if (wording === 'customer' && e.testPoint && !e.skipped) lines.push(`    probes: ${e.testPoint.probe}`);
  if (e.skipped) lines.push(`    skipped: ${e.skipped}`);
  if (e.reading && e.expected) {
    lines.push(`    expected ${e.expected.text}; read ${showValue(e.reading.value, e.expected.unit)} → ${e.reading.outcome}`);
  }
  if (e.expectation) lines.push(`    expected: ${e.expectation}`);
  if (e.answer && !e.reading) lines.push(`    answer: ${answerText(e, wording)}`);
  return lines;
}

function answerText(e: TranscriptEntry, wording: Wording): string {
  return (wording === 'customer' ? e.answer?.customerLabel : undefined) ?? e.answer?.label ?? '';
}

function partLine(p: PartView): string {
  const value = p.value ? ` ${p.value}` : '';
  return `${p.ref}${value} — ${p.where}${p.orientation ? `; ${p.orientation}` : ''}`;
}

function currentLines(step: WalkStep, wording: Wording): string[] {
  if (step.kind === 'conclude' && step.conclusion) {
    const c = step.conclusion;
    const lines = [`Conclusion: ${c.title}`, `  ${step.say[wording]}`];
    if (c.parts.length) lines.push('  Likely parts:', ...c.parts.map((p) => `    ${partLine(p)}`));
    for (const u of c.unexplained ?? []) lines.push(`  ! ${u}`);
    if (c.suspects?.length) {
      lines.push(`  Ranked suspects (from the readings${c.faultPresent ? `; ${FAULT_PRESENT_NOTE}` : ''}):`);
      const shown = c.suspects.slice(0, 5);
      const shared = (c.groups ?? []).filter((g) => g.labels.length > 1 && shown.some((s) => s.group === g.group));
      const inShared = new Set(shared.map((g) => g.group));
      shown.forEach((s, i) => lines.push(`    ${i + 1}. ${faultLabel(s)} — ${percent(s.probability)}${inShared.has(s.group) ? ` (group ${s.group})` : ''} — ${s.why}`));
      if (shared.length) {
        lines.push('  Groups no test point here can split (fix or inspect together):');
        for (const g of shared) lines.push(`    group ${g.group}, ${percent(g.probability)} together: ${groupMembersText(g.labels)}`);
      }
    } else if (c.rankingNote) {
      lines.push(`  (${c.rankingNote})`);
    }
    return lines;
  }
  if (step.kind === 'blocked') return [`Stopped by the safety guard: ${step.say[wording]}`];
  return [`Waiting at [${step.node}] ${step.kind}: ${step.say[wording]}`];
}

function header(t: Transcript): string[] {
  const lines = [`Tree: ${t.tree.id} — ${t.tree.symptom}`, `Board: ${t.board.id} (${t.board.name})`];
  const subs = Object.entries(t.substitutions);
  if (subs.length) lines.push(`Changed parts: ${subs.map(([ref, v]) => `${ref} = ${v}`).join(', ')}`);
  return lines;
}

/** The transcript as plain text, in the technician's or the customer's wording. */
export function formatTranscriptText(t: Transcript, wording: Wording = 'technician'): string {
  const lines = [...header(t), '', ...t.entries.flatMap((e, i) => entryLines(e, i + 1, wording)), '', ...currentLines(t.current, wording)];
  if (t.stopped) lines.push('', `Stopped at [${t.stopped.node}]: ${t.stopped.problem.message}${t.stopped.problem.accepted ? ` (accepted: ${t.stopped.problem.accepted})` : ''}`);
  return `${lines.join('\n')}\n`;
}

const cell = (s: string) => s.replace(/\|/g, '\\|').replace(/\n/g, ' ');

/** The transcript as Markdown: a table of steps, then the conclusion — pasteable into a support chat or a case note. */
export function formatTranscriptMarkdown(t: Transcript, wording: Wording = 'technician'): string {
  const lines = [`## ${cell(t.tree.symptom)}`, '', ...header(t).map((l) => `- ${cell(l)}`), '', '| # | Step | Where | Expected | Reading | Outcome / answer |', '|---|---|---|---|---|---|'];
  t.entries.forEach((e, i) => {
    const where = e.testPoint ? `${e.testPoint.id} ${e.testPoint.label}${wording === 'customer' ? ` (${e.testPoint.probe})` : ''}` : '';
    const result = e.skipped ? `skipped: ${e.skipped}` : e.reading ? e.reading.outcome : answerText(e, wording);
    // A question's computed expectation (a release time, the LEDs lit, the idle draw) goes where a reading's band does.
    const expected = e.expected?.text ?? e.expectation ?? '';
    lines.push(`| ${i + 1} | ${cell(e.say[wording])} | ${cell(where)} | ${cell(expected)} | ${e.reading ? cell(e.reading.text) : ''} | ${cell(result)} |`);
  });
  lines.push('', ...currentLines(t.current, wording).map((l, i) => (i === 0 ? `**${l}**` : l.startsWith('    ') ? `- ${l.trim()}` : l.trim())));
  if (t.stopped) lines.push('', `**Stopped at ${t.stopped.node}:** ${t.stopped.problem.message}`);
  return `${lines.join('\n')}\n`;
}

/** JSON.stringify replacer: JSON has no infinity, and an open circuit reads as one. */
export function jsonNumbers(_key: string, value: unknown): unknown {
  return typeof value === 'number' && !Number.isFinite(value) && !Number.isNaN(value) ? (value > 0 ? 'Infinity' : '-Infinity') : value;
}
