// Segments: profiles, write-ups, definition files, assigning new rows, SQL for scoring.
export * from './definition-exports';
export { profileSegments, EXACT_MEDOID_LIMIT } from './profile';
export type { ProfileInput, SegmentProfile, VariableDifference, KeptSummary, TypicalMember } from './profile';
export { writeUpMarkdown, WRITE_UP_CAUTION } from './write-up';
export type { WriteUpContext } from './write-up';
