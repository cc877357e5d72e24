// The exact hand-off, in memory: every case seen in the field (ids changed, codes merged, a row
// scored differently beside other rows, decimal commas, true/false spellings, definitions that do not
// reproduce their own training rows, everyday CSV files) — each failed before the stored schema.
// Text rule kinsort-text-1 (docs/stored-schema.md); CSV text as RFC 4180 describes it.
import { mkdtempSync, writeFileSync } from 'fs';
import { tmpdir } from 'os';
import { join } from 'path';
import { describe, expect, it } from 'vitest';
import { applyPreparation, loadDefinition, prepareTable, readCsvFile, readTable, study } from '../../src';
import { refusal } from '../reliability/helpers';
import { riders, toCsv } from './definition-data';

const dir = mkdtempSync(join(tmpdir(), 'kinsort-handoff-'));

describe('ids are kept exactly as given', () => {
  it('leading zeros, 17 and 20 digits, 1.0 vs 1, 1e3 vs 1000, a tab: never parsed, trimmed or re-formatted', () => {
    expect(prepareTable('id,x\n007,1\n008,2\n98765432109876543,5\n', { id: 'id' }).ids).toEqual(['007', '008', '98765432109876543']);
    const twenty = prepareTable('id,x\n12345678901234567890,1\n12345678901234567891,2\n', { id: 'id' });
    expect(twenty.ids).toEqual(['12345678901234567890', '12345678901234567891']);
    expect(prepareTable('id,x\n1.0,1\n1,2\n1e3,3\n1000,4\n', { id: 'id' }).ids).toEqual(['1.0', '1', '1e3', '1000']);
    expect(prepareTable('id,x\n\tA7,1\nA7,2\n', { id: 'id' }).ids).toEqual(['\tA7', 'A7']);
    // Declaring the id column's type changes nothing about its text.
    expect(prepareTable('id,x\n000001,1\n2,2\n', { id: 'id', types: { id: 'numeric' } }).ids).toEqual(['000001', '2']);
  });

  it('assign gives back the ids of the scored rows exactly (000001 stays 000001)', () => {
    const seg = study('id,x,y\n000001,1,5\n000002,2,4\n000003,9,1\n000004,8,2\n', { id: 'id' }).prepare().kmeans({ k: 2, seed: 1 });
    expect(seg.ids).toEqual(['000001', '000002', '000003', '000004']);
    const out = seg.definition().assign('id,x,y\n000001,1,5\n1.50,8,2\n');
    expect(out.rows.map((r) => r.id)).toEqual(['000001', '1.50']);
  });
});

describe('category levels keep their text', () => {
  it('declared categorical codes 01, 1, 02 are three levels; zip codes keep their zero on the cards', () => {
    const p = prepareTable('id,code,x,zip\na,01,1,02134\nb,1,2,10001\nc,02,3,02134\nd,1,4,00501\n', {
      id: 'id',
      use: ['code', 'x'],
      keep: ['zip'],
      types: { code: 'categorical' },
    });
    expect(p.preparation.columns.find((c) => c.name === 'code')!.levels).toEqual(['01', '02', '1']);
    expect(p.profile.columns.zip).toEqual(['02134', '10001', '02134', '00501']);
    const seg = study('id,code,x,zip\na,01,1,02134\nb,1,2,10001\nc,02,9,02134\nd,1,8,00501\n', {
      id: 'id',
      use: ['code', 'x'],
      keep: ['zip'],
      types: { code: 'categorical' },
    })
      .prepare()
      .kmeans({ k: 2, seed: 1 });
    const kept = seg.profiles().flatMap((p) => p.kept.map((k) => JSON.stringify(k)));
    expect(kept.join(' ')).toContain('02134');
    expect(seg.cards().html()).toContain('02134');
  });

  it('undeclared codes with leading zeros or + are categorical, never numbers', () => {
    const t = readTable('code,n\n007,1\n12,2\n+5,3\n');
    expect(t.columns[0].inferred).toBe('categorical');
    const zips = readTable('zip\n02134\n10001\n90210\n02134\n');
    expect(zips.columns[0].inferred).toBe('categorical');
  });

  it('tabs and no-break spaces are text; only ASCII spaces are trimmed, and only to read numbers and markers', () => {
    const p = prepareTable(
      { id: ['a', 'b', 'c', 'd'], g: ['\tA', 'A', 'A\u00a0', 'A'], x: [' 5 ', '6', '7', '8'] },
      { id: 'id', types: { g: 'categorical' } },
    );
    expect(p.preparation.columns.find((c) => c.name === 'g')!.levels).toEqual(['\tA', 'A', 'A\u00a0']);
    expect(Array.from(p.mixed.columns.find((c) => c.name === 'x')!.values)).toEqual([5, 6, 7, 8]);
    refusal(
      () => prepareTable({ id: ['a', 'b'], x: ['\t5', '6'] }, { id: 'id', types: { x: 'numeric' } }),
      'row 1 (id "a")',
      'column "x"',
      'not a number',
    );
  });
});

describe('assign never re-infers from the batch', () => {
  const train = 'id,x,zone\n007,1,north\n012,2,north\n031,9,south\n044,8,south\n052,1.5,north\n068,8.5,south\n';
  const def = study(train, { id: 'id' }).prepare().kmeans({ k: 2, seed: 3 }).definition();

  it('a row scored alone gets the id, segment and notes it gets beside another row', () => {
    const alone = def.assign('id,x,zone\n007,1,north\n');
    const beside = def.assign('id,x,zone\n007,1,north\nabc,9,south\n');
    expect(alone.rows[0]).toEqual(beside.rows[0]);
    expect(alone.rows[0].id).toBe('007');
    expect(alone.report.unseenLevels).toEqual([]);
    // A numeric-looking id batch (every id a number) reads the same way too.
    const numbers = def.assign('id,x,zone\n7,1,north\n');
    expect(numbers.rows[0].id).toBe('7');
    expect(numbers.rows[0].segment).toBe(alone.rows[0].segment);
  });

  it('the schema is in the definition: text rule, missing markers, decimal mark, types, levels and level matching', () => {
    const prep = def.definition.preparation as Record<string, unknown>;
    expect(prep.textRule).toBe('kinsort-text-1');
    expect(prep.missingMarkers).toEqual(['NA', 'N/A', 'n/a', '#N/A', 'NaN', 'nan', 'null', 'NULL']);
    expect(prep.decimalMark).toBe('.');
    expect(prep.idColumn).toBe('id');
    expect(def.definition.formatVersion).toBe(3);
    const zone = (prep.columns as { name: string; type: string; levels: string[]; levelMatch: string }[]).find((c) => c.name === 'zone')!;
    expect(zone).toMatchObject({ type: 'binary', levels: ['north', 'south'], levelMatch: 'exact' });
  });

  it('a value not fitting the schema is refused by id and column, the other rows scored', () => {
    const out = def.assign('id,x,zone\n007,1,north\n008,Infinity,north\n009,1.0,North\n010, 2 ,south\n');
    expect(out.rows.map((r) => r.segment === null)).toEqual([false, true, true, false]);
    expect(out.report.refused.map((r) => r.id)).toEqual(['008', '009']);
    expect(out.report.refused[0].reason).toMatch(/column "x" holds "Infinity", which is not a number/);
    expect(out.report.refused[1].reason).toMatch(/column "zone" holds "North", which is not one of the binary column's levels/);
  });

  it('missing markers are the stored ones, compared after trimming ASCII spaces only', () => {
    const med = study(train + '070,NA,north\n', { id: 'id' })
      .prepare({ missing: 'median' })
      .kmeans({ k: 2, seed: 3 })
      .definition();
    const out = med.assign('id,x,zone\na, nan ,north\nb,#N/A,north\nc,NULL,north\nd,\tNA,north\n');
    expect(out.report.imputed[0].ids).toEqual(['a', 'b', 'c']);
    expect(out.report.refused.map((r) => r.id)).toEqual(['d']);
  });
});

describe('decimal commas and thousands separators', () => {
  it('are refused naming the column, never one level per row', () => {
    refusal(() => prepareTable('id;x;y\na;1,5;1\nb;2,5;2\nc;3,25;3\n', { id: 'id' }), 'column "x"', 'decimal comma', "decimalMark: ','");
    refusal(() => prepareTable('id,x,y\na,"1,234",1\nb,"2,500",2\nc,17,3\n', { id: 'id' }), 'column "x"', 'thousands separator');
  });

  it('are read when the decimal mark is named, and the definition stores it', () => {
    const s = study('id;x;y\na;1,5;1\nb;2,5;2\nc;9,25;8\nd;8,5;9\n', { id: 'id', decimalMark: ',' }).prepare();
    expect(Array.from(s.data.mixed.columns[0].values)).toEqual([1.5, 2.5, 9.25, 8.5]);
    const def = s.kmeans({ k: 2, seed: 1 }).definition();
    expect(def.definition.preparation.decimalMark).toBe(',');
    const out = def.assign('id;x;y\nz;9,0;8\n');
    expect(out.rows[0].segment).toBe(def.assign('id;x;y\nz;9;8\n').rows[0].segment);
  });

  it('declared categorical keeps them as levels', () => {
    const p = prepareTable('id;x;y\na;1,5;1\nb;2,5;2\nc;1,5;3\n', { id: 'id', types: { x: 'categorical' } });
    expect(p.preparation.columns[0].levels).toEqual(['1,5', '2,5']);
  });
});

describe('true/false in any letter case', () => {
  it('is one binary column, levels in the user spelling, matched ignoring ASCII case on assign', () => {
    const train = 'id,paid,x\na,TRUE,1\nb,True,2\nc,false,8\nd,FALSE,9\ne,TRUE,1.5\n';
    const s = study(train, { id: 'id' }).prepare({ scale: 'none' });
    const col = s.preparation.columns.find((c) => c.name === 'paid')!;
    expect(col.type).toBe('binary');
    expect(col.levelMatch).toBe('ascii-case');
    expect(col.levels).toEqual(['FALSE', 'TRUE']);
    expect(s.featureNames).toEqual(['paid', 'x']);
    expect(Array.from(s.data.matrix.data.filter((_, i) => i % 2 === 0))).toEqual([1, 1, 0, 0, 1]);
    const def = s.kmeans({ k: 2, seed: 1 }).definition();
    const out = def.assign('id,paid,x\nq,tRuE,1\nr,yes,1\n');
    expect(out.rows[0].segment).toBe(def.assign('id,paid,x\nq,TRUE,1\n').rows[0].segment);
    expect(out.report.refused.map((r) => r.id)).toEqual(['r']);
  });
});

describe('an old preparation (version 1, no schema) is refused when re-applied', () => {
  it('names the version and says to fit again', () => {
    const p = prepareTable('id,x\na,1\nb,2\n', { id: 'id' }).preparation;
    refusal(() => applyPreparation({ ...p, version: 1 } as never, 'id,x\nc,3\n'), 'version 1', 'Fit the preparation again');
  });
});

describe('a definition reproduces its training rows, or says how far it does not', () => {
  const records = riders(400, 21);
  const csv = toCsv(records);

  it('k-means stopped by maxIterations is settled: assign on the training rows gives the fitted segments', () => {
    const seg = study(records, { id: 'rider', use: ['trips', 'peak', 'tenure'] })
      .prepare()
      .kmeans({ k: 6, seed: 2, restarts: 1, maxIterations: 1, refine: false }); // transfers off: an early stop
    expect(seg.notes.join(' ')).toMatch(/stopped at maxIterations \(\d+\).*Lloyd step/);
    const def = seg.definition();
    expect(def.definition.training.reproducedRows).toBe(400);
    const out = def.assign(csv);
    expect(out.rows.map((r) => r.segment)).toEqual(Array.from(seg.assignment, (a) => a + 1));
    expect(def.definition.segments.map((s) => s.size)).toEqual(seg.sizes);
  });

  it('a hierarchy cut records how many rows the nearest-centre rule reproduces; relabelByRule makes them agree', () => {
    const prepared = study(records, { id: 'rider', use: ['trips', 'peak', 'tenure'] }).prepare();
    const cut = prepared.agglomerate({ method: 'ward' }).cut({ k: 6 });
    const agreement = cut.ruleAgreement()!;
    expect(agreement.reproduced).toBeLessThan(400);
    const def = cut.definition();
    expect(def.definition.training.reproducedRows).toBe(agreement.reproduced);
    expect(def.definition.training.labels).toBe('fit');
    const scored = def.assign(csv).rows.map((r) => r.segment);
    const same = scored.filter((s, i) => s === cut.assignment[i] + 1).length;
    expect(same).toBe(agreement.reproduced);
    expect(cut.notes.join(' ')).toContain(`gives ${agreement.reproduced} of the 400 training rows`);
    expect(cut.describeMethod()).toContain(`gives ${agreement.reproduced} of the 400 training rows their segment`);
    const profiles = cut.profiles();
    expect(profiles.reduce((s, p) => s + p.rule!.reproduced, 0)).toBe(agreement.reproduced);
    expect(cut.cards().html()).toMatch(
      /Definition<\/b>: its nearest-centre rule puts [\d.]+\u00a0% of these rows \(\d+ of \d+\) back in this segment/,
    );
    expect(cut.writeUp().markdown()).toContain(`gives ${agreement.reproduced} of the 400 training rows their segment`);

    const relabelled = cut.relabelByRule();
    expect(relabelled.labels).toBe('rule');
    expect(relabelled.notes.join(' ')).toMatch(/Relabelled by the nearest-centre rule/);
    const def2 = relabelled.definition();
    expect(def2.definition.training).toMatchObject({ reproducedRows: 400, labels: 'rule' });
    expect(def2.assign(csv).rows.map((r) => r.segment)).toEqual(Array.from(relabelled.assignment, (a) => a + 1));
    expect(def2.definition.segments.map((s) => s.size)).toEqual(relabelled.sizes);
    expect(relabelled.writeUp().markdown()).toContain('Segments relabelled by the nearest-centre rule');
  });

  it('k-medoids records its figure too', () => {
    const seg = study(records.slice(0, 120), { id: 'rider', use: ['trips', 'peak', 'tenure'] })
      .prepare()
      .kmedoids({ k: 3 });
    const def = seg.definition();
    expect(def.definition.training.reproducedRows).toBe(seg.ruleAgreement()!.reproduced);
  });
});

describe('everyday CSV files', () => {
  it('an empty first header (R write.csv, pandas to_csv) is the row-name column, with a note, usable as id', () => {
    const text = '"","trips","peak"\n"1",3,0.2\n"2",12,0.8\n"3",4,0.3\n"4",11,0.7\n';
    const t = readTable(text);
    expect(t.columns.map((c) => c.name)).toEqual(['row_name', 'trips', 'peak']);
    expect(t.notes!.join(' ')).toMatch(/row-name column "row_name"/);
    const byDefault = prepareTable(text);
    expect(byDefault.featureNames).toEqual(['trips', 'peak']);
    expect(byDefault.report.notes.join(' ')).toMatch(/row-name column/);
    expect(prepareTable(text, { id: 'row_name' }).ids).toEqual(['1', '2', '3', '4']);
  });

  it('a unique-integer column used as a feature without an id gets a note', () => {
    const p = prepareTable('customer,trips\n1001,3\n1002,5\n1003,4\n1004,9\n');
    expect(p.report.notes.join(' ')).toMatch(/Column "customer" holds a different whole number in every row/);
    expect(prepareTable('customer,trips\n1001,3\n1002,5\n1003,4\n', { id: 'customer' }).report.notes.join(' ')).not.toMatch(/whole number/);
  });

  it('trailing lines of empty fields are not rows', () => {
    const t = readTable('a,b,c\n1,2,3\n4,5,6\n,,\n,,\n');
    expect(t.rowCount).toBe(2);
    expect(t.notes!.join(' ')).toMatch(/2 line\(s\) of empty fields at the end/);
  });

  it('Latin-1 bytes are refused naming the encoding problem, and read when the encoding is named', () => {
    const path = join(dir, 'latin1.csv');
    writeFileSync(path, Buffer.from('name,x\nJos\xe9,1\nJos\xe8,2\n', 'latin1'));
    refusal(() => readCsvFile(path), 'not valid UTF-8', 'byte 11', 'line 2', "encoding: 'windows-1252'");
    const t = readCsvFile(path, { encoding: 'latin1' });
    expect(t.columns[0].values).toEqual(['José', 'Josè']);
  });

  it('UTF-16 is named as such (not "ragged"), and read when named', () => {
    const path = join(dir, 'utf16.csv');
    writeFileSync(path, Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from('name,x\nAnn,1\nBo,2\n', 'utf16le')]));
    refusal(() => readCsvFile(path), 'UTF-16', "encoding: 'utf-16le'");
    const noBom = join(dir, 'utf16-nobom.csv');
    writeFileSync(noBom, Buffer.from('name,x\nAnn,1\n', 'utf16le'));
    refusal(() => readCsvFile(noBom), 'zero byte', 'not UTF-8');
    expect(readCsvFile(path, { encoding: 'utf-16le' }).columns[0].values).toEqual(['Ann', 'Bo']);
  });
});

describe('names from the data are never object keys', () => {
  it('a column named __proto__ survives into the profiles and the cards', () => {
    const text =
      'id,trips,__proto__\n' +
      riders(40, 5)
        .map((r, i) => `${r.rider},${r.trips},${i % 2 ? 'even' : 'odd'}`)
        .join('\n') +
      '\n';
    const seg = study(text, { id: 'id', use: ['trips'], keep: ['__proto__'] })
      .prepare()
      .kmeans({ k: 2, seed: 1 });
    expect(Object.keys(seg.data.profile.columns)).toContain('__proto__');
    const kept = seg.profiles()[0].kept.map((k) => k.name);
    expect(kept).toContain('__proto__');
    expect(seg.cards().html()).toContain('__proto__');
  });

  it('column names that differ only in letter case are refused when the definition is built', () => {
    const seg = study({ id: ['a', 'b', 'c', 'd'], X: [1, 2, 8, 9], x: [3, 1, 7, 8] }, { id: 'id' })
      .prepare()
      .kmeans({ k: 2, seed: 1 });
    refusal(() => seg.definition(), '"X" and "x" differ only in letter case');
  });

  it('the loaded definition is the stored one: loading and saving keep the schema byte for byte', () => {
    const def = study(toCsv(riders(60, 4)), { id: 'rider', use: ['trips', 'fare', 'autopay'], keep: ['postcode'] })
      .prepare()
      .kmeans({ k: 3, seed: 1 })
      .definition();
    expect(loadDefinition(def.toJSON()).toJSON()).toBe(def.toJSON());
  });
});
