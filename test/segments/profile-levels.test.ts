// A two-level text column is one variable in a profile, not two mirror images of each other.
import { describe, expect, it } from 'vitest';
import { profileSegments } from '../../src/segments/profile';

describe('profileSegments on text columns', () => {
  const autopay = ['yes', 'yes', 'yes', 'no', 'no', 'no', 'yes', 'no'];
  const fare = ['adult', 'adult', 'student', 'senior', 'student', 'senior', 'adult', 'student'];
  const assignment = [0, 0, 0, 1, 1, 1, 0, 1];
  const features = assignment.map((s, i) => [s, i / 10]);
  const profiles = profileSegments({ assignment, features, used: { autopay, fare } });

  it('lists a two-level column once, by its second sorted level', () => {
    const autopayRows = profiles[0].differences.filter((d) => d.variable === 'autopay');
    expect(autopayRows.map((d) => d.level)).toEqual(['yes']);
    // Segment 1 is all "yes": share 1 against 4/8 overall, sample sd of a 4/4 split over 8 rows.
    const sd = Math.sqrt((8 * 0.25) / 7);
    expect(autopayRows[0].segmentMean).toBe(1);
    expect(autopayRows[0].difference).toBeCloseTo((1 - 0.5) / sd, 12);
  });

  it('keeps one indicator per level for three or more levels', () => {
    const fareLevels = profiles[1].differences
      .filter((d) => d.variable === 'fare')
      .map((d) => d.level)
      .sort();
    expect(fareLevels).toEqual(['adult', 'senior', 'student']);
  });
});
