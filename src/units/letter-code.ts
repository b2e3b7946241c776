/**
 * IEC 60062 tolerance letters (the letter code printed on parts and used in bills of materials).
 * F 1 %, G 2 %, J 5 %, K 10 %, M 20 % — IEC 60062, table of tolerance letter codes.
 */
export const TOLERANCE_LETTERS: Record<string, number> = {
  F: 0.01,
  G: 0.02,
  J: 0.05,
  K: 0.1,
  M: 0.2,
};
