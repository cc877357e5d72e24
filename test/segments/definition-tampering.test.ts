// A definition travels between people and machines: every tampering the loader used to accept is
// refused with a message naming the field (hostile-input issue), and format 1 files (no stored
// schema) are refused with a message saying why and what to do.
import { describe, expect, it } from 'vitest';
import { loadDefinition, study } from '../../src';
import { refusal } from '../reliability/helpers';
import { riders } from './definition-data';

const records = riders(90, 17);
const seg = study(records, {
  id: 'rider',
  use: ['trips', 'peak', 'fare', 'autopay', 'band'],
  keep: ['postcode'],
  ordinalLevels: { band: ['low', 'mid', 'high'] },
})
  .prepare({ missing: 'median' })
  .kmeans({ k: 3, seed: 1, restarts: 2 });
const text = seg.definition().toJSON();

type Json = Record<string, any>;
/** The definition with one edit applied, as JSON text. */
function edited(edit: (d: Json) => void): string {
  const d = JSON.parse(text);
  edit(d);
  return JSON.stringify(d);
}
const column = (d: Json, name: string) => d.preparation.columns.find((c: Json) => c.name === name);

describe('the loader refuses tampered definitions, naming the field', () => {
  it('loads the untouched file', () => {
    expect(loadDefinition(text).toJSON()).toBe(text);
  });

  it('duplicate categorical levels, identical binary levels, ordinal levels against the stored centre', () => {
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            const c = column(d, 'fare');
            c.levels[1] = c.levels[0];
            c.features[1] = c.features[0];
          }),
        ),
      'levels',
      'twice',
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            const c = column(d, 'autopay');
            c.levels[1] = c.levels[0];
          }),
        ),
      'columns[',
      'levels',
      'twice',
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            const c = column(d, 'band');
            c.levels = ['low', 'high'];
            c.center = 1.7;
          }),
        ),
      'center',
      'outside the ranks 0..1',
      'contradict',
    );
  });

  it('weight 0, an empty id column, an id column that is also a feature', () => {
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            column(d, 'trips').weight = 0;
          }),
        ),
      'key "weight" is 0',
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.preparation.idColumn = '';
          }),
        ),
      'key "idColumn"',
      'non-empty',
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.preparation.idColumn = 'trips';
          }),
        ),
      'id column "trips" is also in "columns"',
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.preparation.idColumn = 'postcode';
          }),
        ),
      'id column "postcode" is also in "keep"',
    );
  });

  it('training rows of -5 or 1.5, segment sizes that do not add up', () => {
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.training.rows = -5;
          }),
        ),
      'training',
      'key "rows" is -5',
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.training.rows = 1.5;
          }),
        ),
      'key "rows" is 1.5',
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.segments[0].size += 1;
          }),
        ),
      'segment sizes add up to 91',
      '"training.rows" is 90',
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.training.reproducedRows = 91;
          }),
        ),
      'reproducedRows',
    );
  });

  it('unknown keys inside the preparation and its columns; __proto__ inside preparation, method.options and evidence', () => {
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.preparation.scaling = 'none';
          }),
        ),
      'preparation',
      'unknown key "scaling"',
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            column(d, 'trips').offset = 3;
          }),
        ),
      'columns[0]',
      'unknown key "offset"',
    );
    const proto = (path: string) => text.replace(`"${path}": {`, `"${path}": {\n"__proto__": { "polluted": true },`);
    refusal(() => loadDefinition(proto('preparation')), 'preparation', 'unknown key "__proto__"');
    refusal(() => loadDefinition(proto('options')), 'method.options', '"__proto__"');
    refusal(() => loadDefinition(proto('evidence')), 'evidence', '"__proto__"');
    expect(({} as Json).polluted).toBeUndefined();
  });

  it('control characters where they have no business: writtenBy, names, markers; prose keeps line breaks', () => {
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.writtenBy = 'kinsort 0.1.0\nCREATE TABLE pwned AS SELECT 42 AS x; --';
          }),
        ),
      'writtenBy',
      'control character',
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.preparation.missingMarkers.push('N\u0000A');
          }),
        ),
      'missingMarkers',
      'control character',
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.note = 'fine\u001b[2J';
          }),
        ),
      'note',
      'control character',
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.segments[0].title = 'a\rb';
          }),
        ),
      'title',
      'control character',
    );
    expect(
      loadDefinition(
        edited((d) => {
          d.note = 'two\nlines\tand a tab';
        }),
      ).definition.note,
    ).toBe('two\nlines\tand a tab');
  });

  it('a schema that contradicts itself: text rule, decimal mark, level matching, fills, duplicated markers', () => {
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.preparation.textRule = 'kinsort-text-0';
          }),
        ),
      'textRule',
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.preparation.decimalMark = ';';
          }),
        ),
      'decimalMark',
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            column(d, 'fare').levelMatch = 'ascii-case';
          }),
        ),
      'levelMatch',
      'categorical',
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            column(d, 'autopay').levelMatch = 'ascii-case';
          }),
        ),
      'true/false columns only',
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            column(d, 'fare').fill = 'bus';
          }),
        ),
      'fill',
      "one of the column's levels",
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.preparation.missingMarkers.push('NA');
          }),
        ),
      'missingMarkers',
      'twice',
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.preparation.missingMarkers.push(' NA2 ');
          }),
        ),
      'leading or trailing spaces',
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            column(d, 'trips').log = 'yes';
          }),
        ),
      'key "log"',
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            column(d, 'fare').log = true;
          }),
        ),
      'log1p applies to numeric columns only',
    );
  });

  it('column names clashing in letter case are refused on load too', () => {
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.preparation.keep = ['Trips'];
          }),
        ),
      '"trips" and "Trips" differ only in letter case',
    );
  });

  it('format 1 (no stored schema) is refused saying why and what to do', () => {
    const old = edited((d) => {
      d.formatVersion = 1;
    });
    refusal(() => loadDefinition(old), 'format 1', 'stores no schema', 'Rebuild the definition');
  });
});
