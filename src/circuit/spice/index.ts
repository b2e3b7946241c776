export { parseNetlist, ACCEPTED_ELEMENT_LETTERS, type Analysis, type ParsedNetlist } from './parse-netlist.js';
export { writeNetlist, spiceNodeNames, type WriteNetlistOptions } from './write-netlist.js';
export { readSpiceNumber, formatSpiceNumber, ACCEPTED_SPICE_NUMBER, type SpiceNumber } from './spice-number.js';
