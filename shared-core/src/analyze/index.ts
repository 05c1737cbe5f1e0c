/**
 * The one composition point of the core: parse a note, evaluate it, then check the results tables
 * written in it against the current results. The CLI, the language service and the preview all
 * call it, so they cannot disagree. It sits above `present/` (the written-table check needs the
 * table format) and below `service/`.
 */
export { analyzeNote } from './analyze';
export { analyzeHandingOut, type HandedOutAnalysis, type HandingOut } from './handingOut';
export { createAnalyzer, type Analyzer } from './analyzer';
