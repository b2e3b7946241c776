import { useStdout } from 'ink';

/** The terminal's height in rows, or 40 when it does not say (a test stream, a pipe). */
export function useHeight(): number {
  const { stdout } = useStdout();
  const rows = (stdout as { rows?: number }).rows;
  return rows && rows > 0 ? rows : 40;
}
