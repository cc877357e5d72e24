// A fitted segmentation: the assignment together with the ids and the preparation it came from,
// the analyst's names, and every way to look at it or hand it on. k-means, k-medoids and a cut of
// a hierarchy all give this one kind of object.
import { KinsortError } from '../core/errors';
import { checkInteger, checkOptions } from '../core/options';
import type { Seed } from '../random';
import type { ProgressCallback } from '../core/progress';
import type { PreparedData } from '../prepare';
import { silhouette, type SilhouetteResult } from '../assess/silhouette';
import { adjustedRandIndex } from '../assess/adjusted-rand';
import { normalizedMutualInfo } from '../assess/mutual-information';
import { contingencyTable, type ContingencyTable } from '../assess/contingency';
import { bootstrapStability, type StabilityResult } from '../assess/stability';
import { project, type Projection } from '../methods/project';
import type { Dissimilarity } from '../measure/condensed';
import { profileSegments, type SegmentProfile } from '../segments/profile';
import { buildDefinition } from '../segments/definition-build';
import { definitionHandle, type DefinitionHandle } from '../segments/definition-handle';
import type { DefinitionMethodName } from '../segments/definition-types';
import { profileCardsView, projectionView, silhouetteView, type View } from '../views';
import { showable, type Showable } from './showable';
import { writeUpMarkdown, type WriteUpContext } from '../segments/write-up';
import { writeUpPage } from '../views/write-up-page';
import { segmentRules, type SegmentRulesOptions } from './segment-rules';
import type { SegmentRules } from '../segments/rules';
import { HIERARCHY_CALLS, installWrongStepGuards, type AskTheHierarchyInstead } from './wrong-step';

export interface SegmentName {
  title?: string;
  text?: string;
}

/** What a fitting step hands to a Segmentation. */
export interface SegmentationParts {
  method: DefinitionMethodName;
  /** The options that reproduce the fit (seed, restarts, k, metric, linkage …), for the definition. */
  options: Record<string, unknown>;
  /** 0..k-1 per prepared row. */
  assignment: Int32Array;
  /** One vector per segment in the prepared space (means, or the medoids' rows). */
  centers: number[][];
  /** k-medoids: 0-based prepared row of each segment's medoid. */
  medoids?: number[];
  /** The method's own result, kept whole for the curious. */
  fit: unknown;
  /** Headline figure of the fit, in words and number: "within-SS 123.4", "cost 56.7". */
  objective: { name: string; value: number };
  data: PreparedData;
  /** The dissimilarity the fit used, when it used one (k-medoids on Gower, a hierarchy on a matrix). */
  dissimilarity?: Dissimilarity;
}

const NAME_OPTIONS = ['title', 'text'];

export class Segmentation {
  readonly method: DefinitionMethodName;
  readonly k: number;
  /** Segment of every prepared row, 0..k-1 (people-facing numbers are 1..k). */
  readonly assignment: Int32Array;
  /** Ids of the prepared rows, in the same order as `assignment`. */
  readonly ids: readonly string[];
  /** Rows per segment, segment 1 first. */
  readonly sizes: readonly number[];
  readonly centers: readonly (readonly number[])[];
  readonly medoids?: readonly number[];
  readonly objective: { readonly name: string; readonly value: number };
  readonly fit: unknown;
  readonly data: PreparedData;
  private readonly options: Record<string, unknown>;
  private readonly given: Map<number, SegmentName> = new Map();
  private readonly dissimilarityUsed?: Dissimilarity;
  private silhouetteCache?: SilhouetteResult;
  private projectionCache?: Projection;
  private stabilityCache?: StabilityResult;
  private indexById?: Map<string, number>;

  // Hierarchy calls asked of a segmentation: typed as markers, they throw naming the right object.
  declare readonly dendrogram: AskTheHierarchyInstead;
  declare readonly heatmap: AskTheHierarchyInstead;
  declare readonly cut: AskTheHierarchyInstead;
  declare readonly copheneticCorrelation: AskTheHierarchyInstead;

  constructor(parts: SegmentationParts) {
    this.method = parts.method;
    this.assignment = parts.assignment;
    this.centers = parts.centers;
    this.k = parts.centers.length;
    this.medoids = parts.medoids;
    this.objective = parts.objective;
    this.fit = parts.fit;
    this.data = parts.data;
    this.ids = parts.data.ids;
    this.options = parts.options;
    this.dissimilarityUsed = parts.dissimilarity;
    const sizes = new Array<number>(this.k).fill(0);
    for (let i = 0; i < parts.assignment.length; i++) sizes[parts.assignment[i]]++;
    this.sizes = sizes;
  }

  /** Give segment `segment` (1..k, as printed) a title and a write-up; returns this for chaining. */
  name(segment: number, name: SegmentName): this {
    this.checkSegment(segment, 'name');
    if (name === null || typeof name !== 'object') {
      throw new KinsortError(`name: give the segment's name as { title, text }, e.g. seg.name(${segment}, { title: 'Weekday commuters' }).`, 'bad-option');
    }
    const opts = checkOptions(name, NAME_OPTIONS, 'name');
    for (const key of NAME_OPTIONS) {
      const v = (opts as Record<string, unknown>)[key];
      if (v !== undefined && typeof v !== 'string') {
        throw new KinsortError(`name: ${key} must be text; got ${typeof v}.`, 'bad-option');
      }
    }
    this.given.set(segment, { ...this.given.get(segment), ...opts });
    return this;
  }

  /** The names given so far, by segment number 1..k. */
  names(): Record<number, SegmentName> {
    const out: Record<number, SegmentName> = {};
    for (const [s, n] of [...this.given].sort((a, b) => a[0] - b[0])) out[s] = { ...n };
    return out;
  }

  /** Segment number (1..k) of the row with this id. */
  segmentOf(id: string): number {
    this.indexById ??= new Map(this.ids.map((v, i) => [v, i]));
    const i = this.indexById.get(String(id));
    if (i === undefined) {
      throw new KinsortError(`segmentOf: no prepared row has id "${id}" (dropped rows are listed in the preparation report).`, 'bad-argument');
    }
    return this.assignment[i] + 1;
  }

  /** Ids of the rows in segment `segment` (1..k). */
  members(segment: number): string[] {
    this.checkSegment(segment, 'members');
    const out: string[] = [];
    for (let i = 0; i < this.assignment.length; i++) if (this.assignment[i] === segment - 1) out.push(this.ids[i]);
    return out;
  }

  /** Silhouettes of every row (Rousseeuw 1987), in the space the segmentation was fitted in. */
  silhouette(): SilhouetteResult & Showable {
    this.requireTwo('silhouette');
    this.silhouetteCache ??= this.dissimilarityUsed
      ? silhouette(this.dissimilarityUsed, this.assignment)
      : silhouette(this.data.matrix, this.assignment);
    const result = this.silhouetteCache;
    return showable({ ...result }, () =>
      silhouetteView(result, this.assignment, { names: this.titles(), ids: this.ids }),
    );
  }

  /**
   * Bootstrap stability of each segment (Hennig 2007): the mean Jaccard similarity between the
   * segment and its best match when the method is rerun on resampled rows.
   */
  stability(options: { resamples?: number; seed?: Seed; onProgress?: ProgressCallback } = {}): StabilityResult {
    const opts = checkOptions(options, ['resamples', 'seed', 'onProgress'], 'stability');
    if (this.method === 'hierarchy') {
      throw new KinsortError(
        'stability: bootstrap stability reruns k-means or k-medoids; for a hierarchy cut compare cuts of resampled trees, or fit k-means with the same k and assess that.',
        'not-supported',
      );
    }
    const seed = opts.seed ?? (this.options.seed as Seed | undefined) ?? 0;
    this.stabilityCache = bootstrapStability(this.data.matrix, {
      k: this.k,
      resamples: opts.resamples,
      seed,
      method: this.method,
      assignment: this.assignment,
      onProgress: opts.onProgress,
    });
    return this.stabilityCache;
  }

  /** The numbers behind the cards, one profile per segment. */
  profiles(options: { top?: number } = {}): SegmentProfile[] {
    const opts = checkOptions(options, ['top'], 'profiles');
    const keepNames = new Set(this.data.preparation.keep);
    const used: Record<string, readonly (number | string | null)[]> = {};
    const keep: Record<string, readonly (number | string | null)[]> = {};
    for (const [name, values] of Object.entries(this.data.profile.columns)) {
      (keepNames.has(name) ? keep : used)[name] = values;
    }
    const stab = this.stabilityCache;
    return profileSegments({
      assignment: this.assignment,
      features: this.data.matrix,
      ids: this.ids,
      used,
      keep,
      medoids: this.medoids,
      stability: stab ? { jaccard: stab.jaccard, reading: stab.reading } : undefined,
      names: this.names(),
      top: opts.top,
    });
  }

  /** One card per segment: name, size, what sets it apart, a typical member, kept columns. */
  cards(options: { top?: number; title?: string } = {}): View {
    const opts = checkOptions(options, ['top', 'title'], 'cards');
    return profileCardsView(this.profiles({ top: opts.top }), { title: opts.title });
  }

  /** The rows on their first two principal components, coloured by segment. */
  projection(options: { loadings?: boolean; title?: string } = {}): View {
    const opts = checkOptions(options, ['loadings', 'title'], 'projection');
    this.projectionCache ??= project(this.data.matrix, { components: 2 });
    return projectionView(this.projectionCache, this.assignment, {
      ids: this.ids,
      centers: this.centers,
      names: this.titles(),
      loadings: opts.loadings,
      title: opts.title,
    });
  }

  /** Agreement with another segmentation of the same rows: ARI, NMI and the cross-table. */
  compare(other: Segmentation | ArrayLike<number>): {
    adjustedRandIndex: number;
    normalizedMutualInfo: number;
    table: ContingencyTable;
  } {
    const b = other instanceof Segmentation ? other.assignment : other;
    if (other instanceof Segmentation && other.ids.length === this.ids.length) {
      for (let i = 0; i < this.ids.length; i++) {
        if (other.ids[i] !== this.ids[i]) {
          throw new KinsortError(
            `compare: the two segmentations are of different rows (row ${i + 1} is "${this.ids[i]}" here, "${other.ids[i]}" there).`,
            'bad-assignment',
          );
        }
      }
    }
    return {
      adjustedRandIndex: adjustedRandIndex(this.assignment, b),
      normalizedMutualInfo: normalizedMutualInfo(this.assignment, b),
      table: contingencyTable(this.assignment, b),
    };
  }

  /**
   * Rules that say who is in each segment: a CART tree (Gini) on the original, unscaled columns,
   * one readable rule per leaf, their agreement with the segments, apply() and toSql().
   */
  rules(options: SegmentRulesOptions = {}): SegmentRules & Showable & { drawTree(): View } {
    return segmentRules(this.data, this.assignment, this.k, this.titles(), options);
  }

  /** Everything needed to reproduce and apply this segmentation to new rows. */
  definition(options: { note?: string } = {}): DefinitionHandle {
    const opts = checkOptions(options, ['note'], 'definition');
    const names = this.names();
    const def = buildDefinition({
      preparation: this.data.preparation,
      method: { name: this.method, options: this.options },
      centers: this.method === 'kmedoids' ? undefined : this.centers,
      medoids: this.medoids ? [...this.medoids] : undefined,
      segments: this.sizes.map((size, s) => ({ number: s + 1, size, ...names[s + 1] })),
      training: { ids: this.ids, matrix: this.data.matrix, assignment: this.assignment },
      evidence: this.evidence(),
      note: opts.note,
    }, 'definition');
    return definitionHandle(def);
  }

  /** Apply this segmentation to new rows (through its definition). */
  assign(input: unknown): ReturnType<DefinitionHandle['assign']> {
    return this.definition().assign(input);
  }

  /** A write-up of all segments: Markdown text, or a standalone offline HTML page (cards included). */
  writeUp(options: { title?: string } = {}): { markdown(): string; html(): string; save(path: string): string } {
    const opts = checkOptions(options, ['title'], 'writeUp');
    const profiles = this.profiles();
    const context: WriteUpContext = {
      title: opts.title ?? 'Segments',
      method: this.describeMethod(),
      evidence: this.evidence(),
      report: this.data.report,
    };
    const markdown = (): string => writeUpMarkdown(profiles, context);
    const html = (): string => writeUpPage(profiles, context, this.cards());
    return {
      markdown,
      html,
      save: (path: string) => {
        require('fs').writeFileSync(path, path.toLowerCase().endsWith('.md') ? markdown() : html(), 'utf8');
        return path;
      },
    };
  }

  /** One sentence saying how this segmentation was made. */
  describeMethod(): string {
    const o = this.options;
    const rows = `${this.ids.length} rows, ${this.data.featureNames.length} prepared features (${this.data.preparation.scale} scaling)`;
    switch (this.method) {
      case 'kmeans':
        return `k-means with k = ${this.k}, ${o.restarts ?? 10} restarts, seed ${o.seed ?? 0}, on ${rows}.`;
      case 'kmedoids':
        return `k-medoids (PAM) with k = ${this.k}, ${o.metric ?? 'euclidean'} dissimilarity, on ${rows}.`;
      default:
        return `Agglomerative hierarchy (${o.linkage} linkage, ${o.metric ?? 'euclidean'}) cut into ${this.k} segments, on ${rows}.`;
    }
  }

  /** The figures that back the segmentation, for the definition file and the write-up. */
  private evidence(): Record<string, unknown> {
    const out: Record<string, unknown> = { [this.objective.name]: this.objective.value };
    if (this.silhouetteCache) out.averageSilhouette = this.silhouetteCache.average;
    if (this.stabilityCache) out.stabilityJaccard = [...this.stabilityCache.jaccard];
    return out;
  }

  private titles(): Record<number, string> {
    const out: Record<number, string> = {};
    for (const [s, n] of this.given) if (n.title) out[s] = n.title;
    return out;
  }

  private checkSegment(segment: unknown, where: string): void {
    checkInteger(segment, `${where}: segment number`, 1, this.k);
  }

  private requireTwo(where: string): void {
    if (this.k < 2) throw new KinsortError(`${where} needs at least 2 segments; this segmentation has ${this.k}.`, 'bad-assignment');
  }
}

installWrongStepGuards(Segmentation.prototype, HIERARCHY_CALLS, (name, seg) => {
  const example = name === 'dendrogram' ? `tree.dendrogram({ k: ${seg.k} })` : `tree.${name}(…)`;
  return seg.method === 'hierarchy'
    ? `${name}: this is the segmentation cut from a hierarchy (k = ${seg.k}); ${name}() belongs to the hierarchy ` +
        `itself. Keep the tree in a variable (const tree = prepared.agglomerate({ method: 'ward' })) and ask it: ${example}.`
    : `${name}: this is a ${seg.method} segmentation (k = ${seg.k}); ${name}() belongs to a hierarchy. Build one ` +
        `from the same prepared study, const tree = prepared.agglomerate({ method: 'ward' }), and ask it: ${example}.`;
});
