import { z } from 'zod';
import type { Board } from '../schemas/board.js';
import { boardFigures, BoardFiguresSchema, expectReport, type Band, type BoardFigures, type ExpectOptions, type ExpectReport } from '../circuit/analysis/index.js';
import { cacheKey, decodeNumber, encodeNumber, readCacheFile, writeCacheFile } from './cache-files.js';

/**
 * `voltwalk expect` on a whole board solves tens of thousands of operating points (worst case, then
 * 1,000 Monte Carlo boards under every condition): seconds each time for the same answer. The report
 * is kept on disk, keyed by everything it depends on that lives in data (the board, the
 * substitutions, the condition, the sample count and seed), the program version, and EXPECT_FORMAT,
 * which is raised whenever the solver or the tolerance analyses change their numbers.
 */
export const EXPECT_FORMAT = 'voltwalk-expect/1';

export interface DiskCache {
  dir: string;
  version: string;
}

type CachedOptions = Omit<ExpectOptions, 'onProgress'>;

export function expectKey(board: Board, options: CachedOptions, version: string): string {
  return cacheKey([EXPECT_FORMAT, version, board, options.substitutions ?? {}, options.condition ?? null, options.samples ?? 1000, options.seed ?? 1]);
}

/** A number as written by encodeNumber. */
const stored = z.union([z.number(), z.enum(['NaN', 'Inf', '-Inf'])]).transform(decodeNumber);

const FileSchema = z.object({
  format: z.literal(EXPECT_FORMAT),
  report: z.object({
    bands: z.array(
      z.object({
        id: z.string(),
        node: z.string(),
        condition: z.string(),
        nominal: stored,
        min: stored,
        max: stored,
        unit: z.enum(['V', 'Ω']),
        mcLow: stored.optional(),
        mcHigh: stored.optional(),
      }),
    ),
    solves: z.number(),
    variables: z.number(),
    failures: z.number(),
    unsolved: z.array(z.object({ condition: z.string(), testPoints: z.array(z.string()), reason: z.string() })),
  }),
});

/** The report for these options: from the disk cache when an earlier run made it, else computed (and kept). */
export function cachedExpectReport(board: Board, options: ExpectOptions, disk?: DiskCache): ExpectReport {
  if (!disk) return expectReport(board, options);
  const name = `expect-${expectKey(board, options, disk.version)}.json`;
  const found = FileSchema.safeParse(readCacheFile(disk.dir, name));
  if (found.success) {
    // Typed as the analysis's own report: the file schema cannot drift from it unnoticed.
    const report: ExpectReport = found.data.report;
    return report;
  }
  const report = expectReport(board, options);
  const encodeBand = (b: Band) => ({
    ...b,
    nominal: encodeNumber(b.nominal),
    min: encodeNumber(b.min),
    max: encodeNumber(b.max),
    ...(b.mcLow !== undefined ? { mcLow: encodeNumber(b.mcLow) } : {}),
    ...(b.mcHigh !== undefined ? { mcHigh: encodeNumber(b.mcHigh) } : {}),
  });
  writeCacheFile(disk.dir, name, { format: EXPECT_FORMAT, report: { ...report, bands: report.bands.map(encodeBand) } });
  return report;
}

/**
 * The board's other figures (supply at rest, detector times, hiss, gains) are a second of AC and operating
 * point work for the same answer each run: kept beside the report, keyed by the board (substitutions
 * applied), the program version and FIGURES_FORMAT, raised whenever their numbers change.
 */
export const FIGURES_FORMAT = 'voltwalk-figures/3';

const FiguresFileSchema = z.object({ format: z.literal(FIGURES_FORMAT), figures: BoardFiguresSchema });

export function cachedBoardFigures(board: Board, disk?: DiskCache): BoardFigures {
  if (!disk) return boardFigures(board);
  const name = `figures-${cacheKey([FIGURES_FORMAT, disk.version, board])}.json`;
  const found = FiguresFileSchema.safeParse(readCacheFile(disk.dir, name));
  if (found.success) return found.data.figures;
  const figures = boardFigures(board);
  writeCacheFile(disk.dir, name, { format: FIGURES_FORMAT, figures });
  return figures;
}
