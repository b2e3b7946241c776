import { useStdout } from 'ink';

/** The terminal's width, 80 when it does not say (a test stream, a pipe), never wider than 100. */
export function useWidth(): number {
  const { stdout } = useStdout();
  const columns = (stdout as { columns?: number }).columns;
  return Math.min(100, Math.max(40, columns && columns > 0 ? columns : 80));
}
