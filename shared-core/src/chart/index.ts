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
export { chartLayout, chartUnits, fromPixel, niceStep, stepsIn, toPixel } from './layout';
export type { ChartUnits } from './layout';
export { enthalpyLines, mixingLine, rhCurves, saturationCurve, volumeLines, wetBulbLines } from './curves';
export type { ChartCurve, DbW } from './curves';
export { escapeXml, renderChartFromData } from './render';
export { chartDataFromAnalysis, renderChart } from './fromAnalysis';
export type { FromAnalysisOptions } from './fromAnalysis';
export { chartCss, LIGHT_THEME, VSCODE_THEME_MAP, vscodeThemeCss } from './style';
export { chartWebviewHtml } from './webview';
export type { ChartUpdateMessage, ChartWebviewOptions } from './webview';
