/** The collaborator report: model (plain data) from the plan and its results, rendered to one self-contained HTML file. */
export type * from './types';
export { buildReport } from './buildReport';
export { renderReportHtml, REPORT_STYLE, REPORT_CSP, KEEP_TABLE_ROWS } from './renderReportHtml';
export { diffPlans, showValue, type PlanChange } from './diffPlans';
export { sha256Hex, sha256Bytes, utf8Bytes } from './sha256';
export { chartSvg, binValues, CHART_COLOURS } from './chartSvg';
export { niceTicks, niceStep, tickDecimals } from './niceTicks';
export { formatNumber, formatMoney, formatPercent } from './formatNumber';
export { SECTION_TITLES, SECTION_ORDER } from './sections/context';
export { STANDING_CAUTIONS } from './sections/cautionsSection';
export { reportDesign } from './sections/designSection';
export { DEFAULT_MAX_PLATE_MAPS } from './sections/layoutSection';
export { zPrimeWords } from './sections/pilotSection';
export { formatUtc } from './sections/revisionsSection';
