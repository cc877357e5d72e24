// The order a seeded sample is drawn in: every row gets a key computed from the seed and the text
// of its id alone, and the sample is the rows with the smallest keys (ties, which need two ids with
// one key, go to the smaller id text). The key never depends on where or in which order the rows
// are stored, so the same seed gives the same sample from a table, a copy of it sorted otherwise,
// or the same rows spread over shards behind a ClickHouse Distributed table.
//
// - DuckDB, PostgreSQL, ClickHouse: the MD5 digest of the UTF-8 text 'kinsort-sample:' + seed +
//   ':' + id, as 32 lower-case hex digits, compared as text byte by byte (PostgreSQL: COLLATE "C").
//   The three give one sample for one seed, and `sampleKeyMd5` computes the same key here.
// - SQLite has no hash function of its own without a loaded extension: the key is FNV-1a (32 bit)
//   over the Unicode code points of that same text, then the MurmurHash3 32-bit finaliser (so ids
//   that differ in their last character do not sort next to each other), as plain integer SQL in
//   a recursive query (one step per character). `sampleKeyFnv` computes the same key here.
import { createHash } from 'crypto';
import type { SqlDialect } from './dialect';

/** The text every key is computed from: the seed and the id's text. */
export function sampleKeyText(seed: string, idText: string): string {
  return `kinsort-sample:${seed}:${idText}`;
}

/** The DuckDB / PostgreSQL / ClickHouse key of an id, as those engines compute it. */
export function sampleKeyMd5(seed: string, idText: string): string {
  return createHash('md5').update(sampleKeyText(seed, idText), 'utf8').digest('hex');
}

const FNV_OFFSET = 2166136261;
const FNV_PRIME = 16777619;
const MIX_1 = 0x85ebca6b;
const MIX_2 = 0xc2b2ae35;

/** The SQLite key of an id, as the SQLite query computes it (an integer in 0 … 2^32 − 1). */
export function sampleKeyFnv(seed: string, idText: string): number {
  let h = FNV_OFFSET;
  for (const ch of sampleKeyText(seed, idText)) h = Math.imul(h ^ ch.codePointAt(0)!, FNV_PRIME) >>> 0;
  h = (h ^ (h >>> 16)) >>> 0;
  h = Math.imul(h, MIX_1) >>> 0;
  h = (h ^ (h >>> 13)) >>> 0;
  h = Math.imul(h, MIX_2) >>> 0;
  return (h ^ (h >>> 16)) >>> 0;
}

/** The md5 key of a text expression, as SQL. */
export function md5KeySql(d: SqlDialect, text: string): string {
  if (d.name === 'clickhouse') return `lower(hex(MD5(${text})))`;
  if (d.name === 'postgres') return `md5(${text}) COLLATE "C"`;
  return `md5(${text})`;
}

// SQLite integers are 64-bit and an overflowing product turns into a double: every product here
// stays below 2^57 (FNV: a 32-bit value times a 25-bit prime; the finaliser multiplies by the
// constant's two 16-bit halves separately). XOR is (a | b) − (a & b).
const MASK = 4294967295;
const xor = (a: string, b: string) => `((${a} | ${b}) - (${a} & ${b}))`;
const mulMod32 = (x: string, c: number) => `(((${x} * ${c & 0xffff}) + (((${x} * ${c >>> 16}) & 65535) << 16)) & ${MASK})`;

/**
 * SQLite: a recursive query `name(id, s, n, pos, h)` whose rows with pos = n + 6 hold every id's key
 * in h. `ids` is a SELECT giving one column, the id text, for every row with an id; `prefix` is the
 * quoted text before the id.
 */
export function fnvKeysSql(d: SqlDialect, name: string, ids: string, prefix: string): string {
  const q = (x: string) => d.quoteIdentifier(x);
  const [id, s, n, pos, h] = ['kinsort_id', 'kinsort_s', 'kinsort_n', 'kinsort_pos', 'kinsort_h'].map(q);
  const char = `unicode(substr(${s}, ${pos}, 1))`;
  const step = [
    `WHEN ${pos} <= ${n} THEN (${xor(h, char)} * ${FNV_PRIME}) & ${MASK}`,
    `WHEN ${pos} = ${n} + 1 THEN ${xor(h, `(${h} >> 16)`)}`,
    `WHEN ${pos} = ${n} + 2 THEN ${mulMod32(h, MIX_1)}`,
    `WHEN ${pos} = ${n} + 3 THEN ${xor(h, `(${h} >> 13)`)}`,
    `WHEN ${pos} = ${n} + 4 THEN ${mulMod32(h, MIX_2)}`,
    `ELSE ${xor(h, `(${h} >> 16)`)}`,
  ];
  return [
    `${q(name)}(${id}, ${s}, ${n}, ${pos}, ${h}) AS (`,
    `  SELECT ${id}, ${prefix} || ${id}, length(${prefix} || ${id}), 1, ${FNV_OFFSET} FROM (${ids})`,
    `  UNION ALL`,
    `  SELECT ${id}, ${s}, ${n}, ${pos} + 1, CASE ${step.join(' ')} END FROM ${q(name)} WHERE ${pos} <= ${n} + 5`,
    `)`,
  ].join('\n');
}
