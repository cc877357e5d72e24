// The demo's segment names, shared by the demo report and the README screenshots.
// Names go to the segment whose card shows the trait, not to a fixed number, so they stay right
// even if a different seed or a change in the k-means core numbers the segments differently.
/** @type {{ trait: [string, string | null, number], title: string, text: string }[]} */
const NAMES = [
  {
    trait: ['peak_share', null, +1],
    title: 'Weekday peak commuters',
    text: 'Ride most days, mostly at peak, rarely at weekends; mostly adult fares.',
  },
  { trait: ['fare_type', 'student', +1], title: 'Students topping up', text: 'Student fares, many small top-ups, short tenure.' },
  { trait: ['avg_trip_km', null, +1], title: 'Long-distance regulars', text: 'Long trips, long tenure, on autopay; the regional commute.' },
  { trait: ['weekend_share', null, +1], title: 'Weekend and off-peak riders', text: 'Weekend and off-peak trips; more senior fares.' },
  { trait: ['tenure_months', null, -1], title: 'Occasional newcomers', text: 'Few trips a week and recently joined; little autopay.' },
];

/**
 * Segment (1..k) whose card shows each trait most strongly, each segment used once.
 * @param {import('../src/index').SegmentProfile[]} profiles
 * @param {typeof NAMES} names
 */
function segmentsByTrait(profiles, names) {
  const taken = new Set();
  return names.map(({ trait: [variable, level, sign] }) => {
    let best = -1;
    let bestScore = -Infinity;
    for (const p of profiles) {
      if (taken.has(p.segment)) continue;
      const d = p.differences.find((x) => x.variable === variable && (level === null || x.level === level));
      const score = d ? sign * d.difference : -Infinity;
      if (score > bestScore) {
        bestScore = score;
        best = p.segment;
      }
    }
    taken.add(best);
    return best;
  });
}

module.exports = { NAMES, segmentsByTrait };
