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
  Pixel,
} from './types';
export { chartLayout, chartUnits, fitRange, fromPixel, niceStep, stepsIn, toPixel, DEFAULT_PLOT_HEIGHT, DEFAULT_WIDTH } from './layout';
export type { ChartUnits } from './layout';
export {
  clipPolyline,
  enthalpyLines,
  familySteps,
  mixingLine,
  rhCurves,
  sampleCurve,
  saturationCurve,
  volumeLines,
  wetBulbLines,
} from './curves';
export type { ChartCurve, DbW } from './curves';
export { escapeXml, MARKER_RADIUS, renderChartFromData } from './render';
export { chartDataFromAnalysis, renderChart } from './fromAnalysis';
export type { FromAnalysisOptions } from './fromAnalysis';
export { chartCss, DARK_THEME, LIGHT_THEME, VSCODE_THEME_MAP, vscodeThemeCss } from './style';
export { chartWebviewHtml } from './webview';
export type { ChartUpdateMessage, ChartWebviewOptions } from './webview';
