/**
 * Said beside the suspects when "no fault" was left out because the walk concluded a fault. Its
 * own module, with no imports, so the screens can say it without loading the ranking.
 */
export const FAULT_PRESENT_NOTE = 'a fault was found, so "no fault" is left out';
