// The database path (docs/database-path.md) on DuckDB, SQLite, PostgreSQL 15 and the two-shard
// ClickHouse table, the servers started once for all of it: sampleFromDatabase, refineInDatabase
// against Lloyd in memory, and the fluent path from a sample to a refined segmentation.
import { useDatabaseEngines } from './database-engines';
import { refineCases } from './refine-cases';
import { refineFluentCases } from './refine-fluent-cases';
import { sampleCases } from './sample-cases';

const engines = useDatabaseEngines();
sampleCases(engines);
refineCases(engines);
refineFluentCases(engines);
