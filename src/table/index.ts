// Intake: records, column objects, CSV text/files, dataframe-like objects, number[][] → Table.
export { readTable, readCsvFile, tableColumn, DECLARED_TYPES } from './read';
export type { ReadTableOptions } from './read';
export { isTable } from './types';
export type { Table, TableColumn, Cell, InferredType, DeclaredType } from './types';
export { DEFAULT_MISSING_MARKERS } from './cells';
