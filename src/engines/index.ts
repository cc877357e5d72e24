export type { DialectName, SqlDialect } from './dialect';
export { DIALECT_NAMES, NUMBER_GRAMMAR } from './dialect';
export { dialectNamed } from './dialects';
export type { SqlEngine } from './engine';
export { duckdbEngine, postgresEngine } from './engine';
