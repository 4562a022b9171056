/** Matrix Market exchange and reports (text and JSON); strings in, strings out. */
export { readMatrixMarket, writeMatrixMarket, writeDofMap, READ_MATRIX_MARKET_DEFAULTS, DOF_MAP_DEFAULTS, type ReadMatrixMarketOptions, type DofMapOptions, type DofMapFormat } from './matrix-market';
export { formatModesText, formatMatrixModesText } from './report-text';
export { modesJsonObject, matrixModesJsonObject, verificationObject, type JsonReportOptions } from './report-json';
export { ENGINEERING_CAUTION } from './caution';
export { formatScreeningText, screeningJsonObject, SCREENING_NOTE } from './report-screening';
export { formatHarmonicText, harmonicJsonObject, formatPedestrianText, pedestrianJsonObject, type SweepDescription } from './report-response';
export { shapeSvg, modeShapeSvg, shapeLayout, modeCaption, dominantDirection, SHAPE_DRAWING_DEFAULTS, type ShapeDrawingOptions, type ShapeLayout, type DrawnNode } from './svg-mode';
export { effectiveMassChartSvg, MASS_CHART_DEFAULTS, type MassChartOptions } from './svg-chart';
export { frequencyResponseSvg, FREQUENCY_RESPONSE_SVG_DEFAULTS, type FrequencyResponseSvgOptions, type ResponseQuantity } from './svg-response';
export { escapeXml, spaceView, PLANE_VIEW, VIEW_DEFAULTS, PALETTE, type ViewAxes, type ViewAngles } from './svg-common';
export { htmlReport, HTML_REPORT_DEFAULTS, pictureSegments, type HtmlReportOptions } from './report-html';
