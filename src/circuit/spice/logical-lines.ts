/**
 * Splits netlist text into SPICE's logical lines: the first line is the title, `*` starts a
 * full-line comment, `;` (and `$` after a space) start an inline comment, a line starting with `+`
 * continues the one before, and nothing after `.end` is read. Each logical line keeps the number
 * of the physical line it started on, so every error can point at it.
 *
 * Comment lines starting with `*@` are annotations our writer leaves for our reader (ngspice
 * skips them as comments); they are passed through whole rather than dropped.
 */

export interface LogicalLine {
  /** 1-based number of the physical line the logical line starts on. */
  line: number;
  /** The text, continuations joined with a space, comments removed, trimmed. */
  text: string;
  /** True for a `*@` annotation (its text is what follows the `*@`). */
  annotation?: boolean;
}

export interface SplitNetlist {
  title: string;
  lines: LogicalLine[];
  /** Line number of `.end`, when present. */
  endLine?: number;
  /** Whether anything but blank lines and comments followed `.end`. */
  textAfterEnd: boolean;
}

function stripInlineComment(text: string): string {
  const semicolon = text.indexOf(';');
  let cut = semicolon >= 0 ? semicolon : text.length;
  const dollar = /(^|\s)\$/.exec(text);
  if (dollar && dollar.index < cut) cut = dollar.index;
  return text.slice(0, cut);
}

export function splitNetlist(text: string): SplitNetlist {
  const physical = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/);
  const title = (physical[0] ?? '').trim();
  const lines: LogicalLine[] = [];
  let endLine: number | undefined;
  let textAfterEnd = false;
  for (let i = 1; i < physical.length; i++) {
    const raw = physical[i];
    const trimmed = raw.trim();
    if (endLine !== undefined) {
      if (trimmed !== '' && !trimmed.startsWith('*')) textAfterEnd = true;
      continue;
    }
    if (trimmed.startsWith('*@')) {
      lines.push({ line: i + 1, text: trimmed.slice(2).trim(), annotation: true });
      continue;
    }
    if (trimmed === '' || trimmed.startsWith('*')) continue;
    const body = stripInlineComment(trimmed).trim();
    if (body.startsWith('+')) {
      const previous = lines[lines.length - 1];
      const rest = body.slice(1).trim();
      if (previous && !previous.annotation) {
        previous.text = `${previous.text} ${rest}`.trim();
        continue;
      }
      // A continuation with nothing to continue: keep it so the reader reports it at its line.
      lines.push({ line: i + 1, text: body });
      continue;
    }
    if (body === '') continue;
    if (/^\.end$/i.test(body)) {
      endLine = i + 1;
      continue;
    }
    lines.push({ line: i + 1, text: body });
  }
  return { title, lines, ...(endLine !== undefined ? { endLine } : {}), textAfterEnd };
}
