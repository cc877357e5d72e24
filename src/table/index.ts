// Intake: records, column objects, CSV text/files, dataframe-like objects, number[][] → Table.
export { readTable, readCsvFile, tableColumn, DECLARED_TYPES, ROW_NAME_COLUMN } from './read';
export type { ReadTableOptions } from './read';
export { isTable } from './types';
export type { Table, TableColumn, Cell, InferredType, DeclaredType } from './types';
export { DEFAULT_MISSING_MARKERS, TEXT_RULE, DECIMAL_MARKS } from './cells';
export type { DecimalMark } from './cells';
