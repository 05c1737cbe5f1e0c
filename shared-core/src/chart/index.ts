/** The psychrometric chart: pure, data in, SVG text out (see render.ts and fromAnalysis.ts). */
export type {
  ChartData,
  ChartFamilies,
  ChartInfeasible,
  ChartLayout,
  ChartMix,
  ChartOptions,
  ChartPoint,
  ChartProcess,
  ChartRange,
  ChartShrLine,
  Pixel,
} from './types';
export { CHART_GROUPINGS, caseAt, chartCases, chartOption } from './cases';
export type { ChartCase, ChartGrouping } from './cases';
export { chartLayout, chartUnits, fromPixel, niceStep, stepsIn, toPixel } from './layout';
export type { ChartUnits } from './layout';
export { enthalpyLines, mixingLine, rhCurves, saturationCurve, volumeLines, wetBulbLines } from './curves';
export type { ChartCurve, DbW } from './curves';
export { escapeXml, renderChartFromData, renderSizedChart } from './render';
export type { SizedChart } from './render';
export { chartDataFromAnalysis, renderChart, renderChartCases } from './fromAnalysis';
export type { CaseChart, FromAnalysisOptions } from './fromAnalysis';
export { chartCss, DARK_THEME, LIGHT_THEME, OWN_COLOURS, VSCODE_THEME_MAP, vscodeThemeCss } from './style';
export { chartWebviewHtml, chartWidthFor, plotHeightFor } from './webview';
export type { ChartResizeMessage, ChartUpdateMessage, ChartWebviewOptions } from './webview';
