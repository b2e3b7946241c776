import type { Problem } from '../errors.js';

/** Line and column (1-based) of a character offset. */
export function lineColumn(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let start = 0;
  for (let i = 0; i < offset && i < text.length; i++) {
    if (text.charCodeAt(i) === 10) {
      line++;
      start = i + 1;
    }
  }
  return { line, column: offset - start + 1 };
}

/**
 * JSON.parse with a Problem instead of V8's message: where (line:column) and what, so a person can
 * find a missing comma in a 600-line board file.
 */
export function parseJson(text: string, file: string, prefix: string): { value?: unknown; problem?: Problem } {
  try {
    return { value: JSON.parse(text.replace(/^\uFEFF/, '')) };
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    const pos = /at position (\d+)/.exec(message);
    const offset = pos ? Number(pos[1]) : text.length;
    const { line, column } = lineColumn(text, offset);
    const what = message.replace(/\s*in JSON at position \d+.*$/, '').replace(/^Unexpected end of JSON input$/, 'the file ends early (a missing } or ])');
    return {
      problem: {
        code: `${prefix}.json-syntax`,
        file,
        path: `line ${line}, column ${column}`,
        message: `not valid JSON: ${what}`,
        accepted: 'JSON: double-quoted keys and strings, commas between items, none after the last',
      },
    };
  }
}
