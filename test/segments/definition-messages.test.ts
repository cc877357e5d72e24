// Loader messages read as sentences: a key that is absent is called missing.
import { describe, expect, it } from 'vitest';
import { loadDefinition } from '../../src/study/definition-handle';

describe('loadDefinition messages', () => {
  it('says the "kind" key is missing when a JSON object is not a definition', () => {
    expect(() => loadDefinition('{"a": 1}')).toThrow(/key "kind" is missing; expected "kinsort segment definition"/);
  });
  it('quotes a wrong kind as given', () => {
    expect(() => loadDefinition('{"kind": "recipe"}')).toThrow(/key "kind" is string "recipe"/);
  });
});
