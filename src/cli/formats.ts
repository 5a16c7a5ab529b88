/**
 * The output formats of `boltzmark report`: a table for people, JSON (the contract), CSV and Markdown. Each
 * lives in its own module; this one gathers their exported names, which the rest of the command imports from here.
 */
export { where, type Row } from './rows';
export { textWidth } from './textWidth';
export { DEFAULT_TABLE_WIDTH, formatTable, type TableOptions } from './table';
export { formatJson, jsonElement, jsonSafe } from './json';
export { formatCsv, formatLinePoints } from './csv';
export { formatMarkdown } from './markdown';
