// Measurement plans: the versioned JSON format the viewer saves and `midrail check` runs, its
// validation (errors name JSON paths), and running a plan on a dump. Pure: no DOM, no Node APIs
// (the .xlsx writer in workbook.ts loads exceljs on first use).

export { PLAN_FORMAT, PLAN_VERSION, type Plan, type MeasurementSpec, type MeasurementKind, type EdgeChoice } from './types';
export type { DelaySpec, SkewSpec, GlitchSpec, PulseWidthSpec, PeriodSpec, PeriodQuantity } from './types';
export { PLAN_SCHEMA, PlanError, formatPlan, parsePlan, planIssues, toPlan } from './validate';
export type { PathIssue } from './schemaCheck';
export { type Limits, type ValueUnit, limitsOf, quantityOf } from './limits';
export { runMeasurement, runPlan } from './run';
export { LevelMap } from './levels';
export { formatValue } from './format';
export * from './result';
export { mergeDocuments, asCheckDocument, MergeError } from './merge';
export { checkJunitXml, checkSuites } from './toJunit';
export { checkTables, type Table } from './sheets';
export { checkWorkbook, checkCsvFiles, tableCsv, tablesWorkbook } from './workbook';
