// Preparation: scaling, log1p, weights, one-hot, missing-value policy; a serialisable Preparation.
export { prepareTable } from './prepareTable';
export { applyPreparation } from './applyPreparation';
export { setPreparedLimits } from './width-guard';
export type { PreparedLimits } from './width-guard';
export type { ApplyPreparationOptions } from './applyPreparation';
export { SCALE_METHODS, MISSING_POLICIES } from './types';
export type {
  PrepareOptions,
  Preparation,
  PreparedColumn,
  PreparationReport,
  PreparedData,
  DroppedRow,
  ImputedColumn,
  UnseenLevel,
  ScaleMethod,
  MissingPolicy,
} from './types';
