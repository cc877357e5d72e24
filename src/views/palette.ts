// Our own segment palette. Chosen by a greedy search that maximised the smallest CIEDE2000
// difference between any two colours as seen with normal vision and under simulated
// protanopia, deuteranopia and tritanopia (test/views/palette.test.ts keeps it so). Colour never
// carries meaning alone: the segment number is printed beside it.

export const SEGMENT_COLOURS: readonly string[] = [
  '#1a6699', // 1 harbour blue
  '#e6991a', // 2 marigold
  '#993333', // 3 brick
  '#33cce6', // 4 sky
  '#e63366', // 5 raspberry
  '#8080e6', // 6 periwinkle
  '#1a9980', // 7 jade
  '#99cc80', // 8 sage
];

/** Neutral ink and paper shared by every view. */
export const INK = {
  text: '#22262b',
  muted: '#5d6670',
  grid: '#e3e6ea',
  axis: '#8a939c',
  paper: '#ffffff',
  panel: '#f6f7f9',
  accent: '#b8324a', // marks a recommendation or a cut line
  // Above / below the whole: two neutral inks (dark and light slate), so no bar reads as a segment.
  above: '#3f4a56',
  below: '#a9b2bc',
} as const;

/** Colour of segment `s` (0-based). Past eight segments the colours repeat; numbers tell them apart. */
export function segmentColour(s: number): string {
  const n = SEGMENT_COLOURS.length;
  return SEGMENT_COLOURS[((s % n) + n) % n];
}

/** Black or white text, whichever reads better on `hex`. */
export function textOn(hex: string): string {
  const v = parseInt(hex.slice(1), 16);
  const r = (v >> 16) & 255;
  const g = (v >> 8) & 255;
  const b = v & 255;
  return 0.299 * r + 0.587 * g + 0.114 * b > 150 ? '#111111' : '#ffffff';
}
