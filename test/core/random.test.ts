import { describe, expect, it } from 'vitest';
import { createRandom, xoshiro128FromState } from '../../src/random';

describe('createRandom', () => {
  it('gives the same stream for the same seed', () => {
    const a = createRandom(42);
    const b = createRandom(42);
    for (let i = 0; i < 1000; i++) expect(a.uint32()).toBe(b.uint32());
  });

  it('gives different streams for different seeds, including string seeds', () => {
    const a = createRandom(1).uint32();
    expect(createRandom(2).uint32()).not.toBe(a);
    expect(createRandom('riders').next()).toBe(createRandom('riders').next());
    expect(createRandom('riders').next()).not.toBe(createRandom('stations').next());
  });

  it('matches the xoshiro128** reference outputs for state [1, 2, 3, 4]', () => {
    // Test vector of the reference C implementation (Blackman & Vigna), as the rand_xoshiro
    // crate's tests carry it; from memory, and it matched on first run.
    const r = xoshiro128FromState([1, 2, 3, 4]);
    const out = Array.from({ length: 10 }, () => r.uint32());
    expect(out).toEqual([11520, 0, 5927040, 70819200, 2031721883, 1637235492, 1287239034, 3734860849, 3729100597, 4258142804]);
  });

  it('pins the first outputs so a change to the generator is noticed (streams must not drift between versions)', () => {
    const r = createRandom(7);
    const first = [r.uint32(), r.uint32(), r.uint32()];
    // Recorded from this implementation; any edit to the generator or seeding changes them,
    // and with them every seeded result users have saved.
    expect(first).toEqual(PINNED_SEED_7);
  });

  it('draws uniform doubles in [0, 1) with the right mean and integers without bias', () => {
    const r = createRandom(3);
    let sum = 0;
    const counts = new Array(6).fill(0);
    const n = 60_000;
    for (let i = 0; i < n; i++) {
      const u = r.next();
      expect(u).toBeGreaterThanOrEqual(0);
      expect(u).toBeLessThan(1);
      sum += u;
      counts[r.int(6)]++;
    }
    expect(sum / n).toBeCloseTo(0.5, 2);
    for (const c of counts) expect(Math.abs(c - n / 6)).toBeLessThan(5 * Math.sqrt(n / 6));
  });

  it('draws standard normals with mean 0 and variance 1', () => {
    const r = createRandom(11);
    let s = 0;
    let s2 = 0;
    const n = 50_000;
    for (let i = 0; i < n; i++) {
      const z = r.normal();
      s += z;
      s2 += z * z;
    }
    expect(s / n).toBeCloseTo(0, 1);
    expect(s2 / n).toBeCloseTo(1, 1);
  });

  it('forks independent streams that do not depend on how far the parent has run', () => {
    const a = createRandom(5);
    const forkBefore = a.fork('restart-1').uint32();
    a.next();
    a.next();
    expect(a.fork('restart-1').uint32()).toBe(forkBefore);
    expect(a.fork('restart-2').uint32()).not.toBe(forkBefore);
  });

  it('shuffles into a permutation and refuses bad seeds', () => {
    const values = Array.from({ length: 50 }, (_, i) => i);
    createRandom(9).shuffle(values);
    expect([...values].sort((x, y) => x - y)).toEqual(Array.from({ length: 50 }, (_, i) => i));
    expect(() => createRandom(1.5)).toThrow(/whole number/);
    expect(() => createRandom(NaN)).toThrow(/whole number/);
  });
});

const PINNED_SEED_7 = [1004282400, 2200021487, 1928073449];
