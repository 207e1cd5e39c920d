// Worst-case sheet and its exports (CSV, .xlsx), with the formula-injection guard and provenance.

export { neutralizeText } from './inject';
export { csvField, csvLine, toCsv } from './csv';
export { type Cell, type MeasurementSheet, type SummaryRow, SUMMARY_KEYS, delaySheet, edgesSheet, glitchSheet, skewSheet } from './sheet';
export { type Provenance, provenanceFor, provenanceRows, sha256Hex } from './provenance';
export { cellValue, newWorkbook, sheetName, writeXlsx } from './xlsx';
