export { parseValue, parseReading, ACCEPTED_VALUE_FORMS, type ParsedValue, type Quantity, type UnitSymbol } from './parse-value.js';
export { formatValue, formatReading, formatAligned, formatBand, bandFigures } from './format-value.js';
export { E_SERIES, SERIES_NAMES, nearestPreferred, isPreferred, type SeriesName, type Preferred } from './e-series.js';
export { COLOURS, toColour, decodeBands, encodeBands, bandsFor, type Colour, type BandReading } from './colour-code.js';
export { TOLERANCE_LETTERS } from './letter-code.js';
export { parseHissReading } from './parse-hiss.js';
export { DBU_REFERENCE_VOLTS, toDbu, fromDbu } from './decibels.js';
