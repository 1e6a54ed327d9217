/** Exports in open formats: CSV + data dictionary, GeoJSON, Darwin Core tables, the printable report. */
export { coverageStatement } from './coverage.ts';
export { dataDictionaryCsv, eventsCsv, valueColumnName } from './csv.ts';
export { type DwcResult, dwcTables } from './dwc.ts';
export { entriesGeoJson, geoJsonText } from './geojson.ts';
export { CAUTIONS as REPORT_CAUTIONS, escapeHtml, type ReportOptions, reportHtml } from './report.ts';
export { csvText } from './rfc4180.ts';
