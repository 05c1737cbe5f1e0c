/**
 * Results of each air block as formatted data, the HTML (Markdown preview) and Markdown tables
 * made from it, and the tables written into a note (markers, checksum, stale check).
 */
export { allBlockResults, blockResults, isEmptyResults, type BlockResults, type ResultsData } from './blockResults';
export { resultsTableHtml, resultsTableMarkdown, type HtmlOptions } from './resultsTable';
export {
  RESULTS_COMMAND_TITLE,
  STALE_RESULTS_TABLE,
  tableSlots,
  tableState,
  type TableSlot,
  type TableState,
  type WrittenTable,
} from './writtenTables';
export {
  PROCESS_KIND_TEXT,
  claimDimension,
  claimFigures,
  claimRow,
  heatFigure,
  processKindText,
  processRow,
  stateFigure,
  stateRow,
  waterFigure,
  waterUnit,
  type ClaimRow,
  type Figure,
  type ProcessRow,
  type RowOptions,
  type StateFigureKey,
  type StateRow,
} from './rows';
export {
  itemsResultsHtml,
  noteHtml,
  statementComment,
  type ImageAnswer,
  type MissingImage,
  type NoteHtml,
  type NoteHtmlOptions,
} from './noteHtml';
export { readFrontMatter, withoutFrontMatter, type FrontMatter } from './frontMatter';
