// A fitted segmentation: the assignment together with the ids and the preparation it came from,
// the analyst's names, and every way to look at it or hand it on. k-means, k-medoids and a cut of
// a hierarchy all give this one kind of object.
import { saveText } from '../core/save-file';
import { takeRows } from '../core/matrix';
import type { DensitySegmentsResult } from '../methods/density';
import { buildDensityDefinition } from '../segments/definition-dense-build';
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
import { definitionHandle, type DefinitionHandle } from './definition-handle';
import { DEFINITION_METRICS, type DefinitionMethodName, type DefinitionMetric, type TrainingLabels } from '../segments/definition-types';
import { insideNotebookKernel } from '../notebook';
import { ruleAgreement, type RuleAgreement } from './reproduce';
import { profileCardsView, projectionView, silhouetteView, type View } from '../views';
import { showable, type Showable } from './showable';
import { writeUpMarkdown, type WriteUpContext } from '../segments/write-up';
import { writeUpPage } from '../views/write-up-page';
import { segmentRules, type SegmentRulesOptions } from './segment-rules';
import type { SegmentRules } from '../segments/rules';
import { HIERARCHY_CALLS, installWrongStepGuards, type AskTheHierarchyInstead } from './wrong-step';
import { membershipTable, mixtureAgreement, type MembershipTable, type MixtureParts } from './mixture-parts';

/** The rule's name as the notes and cards print it. */
function ruleWords(rule: RuleAgreement['rule']): string {
  return rule === 'nearest-center' ? 'nearest-centre' : rule;
}

/** The noise card's title and text (density segments). */
export const NOISE_TITLE = 'Noise: in no segment';
const NOISE_TEXT =
  'Rows in no dense region at the chosen minSize / minSamples. They are kept and shown, not dropped; their outlier scores are on the fit.';

export interface SegmentName {
  title?: string;
  text?: string;
}

/** How a segmentation was made: a definition method, or density segments (which mark noise). */
export type SegmentationMethod = DefinitionMethodName | 'density';

/** What a fitting step hands to a Segmentation. */
export interface SegmentationParts {
  method: SegmentationMethod;
  /** The options that reproduce the fit (seed, restarts, k, metric, linkage …), for the definition. */
  options: Record<string, unknown>;
  /** 0..k-1 per prepared row; -1 (noise, in no segment) only from density segments. */
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
  /** 'rule' when the segmentation was relabelled by its own nearest-centre / medoid rule. */
  labels?: TrainingLabels;
  /** What the fitting step decided that a person should know. */
  notes?: string[];
  /** Gaussian mixtures: weights, covariances and membership probabilities. */
  mixture?: MixtureParts;
}

const NAME_OPTIONS = ['title', 'text'];

export class Segmentation {
  readonly method: SegmentationMethod;
  readonly k: number;
  /**
   * Segment of every prepared row, 0..k-1: the functional core's numbering (index into `centers`,
   * `sizes`). Everything a person reads (names, cards, profiles, members, definitions, `segments`)
   * numbers segments 1..k. Density segments mark rows in no segment (noise) with -1.
   */
  readonly assignment: Int32Array;
  /** Segment of every prepared row, 1..k, as names, cards, members and definitions number them; 0 = noise. */
  readonly segments: Int32Array;
  /** Rows in no segment (noise; density segments only, else 0). Never counted in `sizes`. */
  readonly noiseCount: number;
  /** Ids of the prepared rows, in the same order as `assignment`. */
  readonly ids: readonly string[];
  /** Rows per segment, segment 1 first. */
  readonly sizes: readonly number[];
  readonly centers: readonly (readonly number[])[];
  readonly medoids?: readonly number[];
  readonly objective: { readonly name: string; readonly value: number };
  readonly fit: unknown;
  readonly data: PreparedData;
  /** 'fit': segments as the method gave them; 'rule': relabelled by the definition's own rule. */
  readonly labels: TrainingLabels;
  /** Notes on the fit (settling k-means, how far the scoring rule reproduces the segments). */
  readonly notes: readonly string[];
  private readonly options: Record<string, unknown>;
  private readonly mixture?: MixtureParts;
  private readonly given: Map<number, SegmentName> = new Map();
  private agreementCache?: RuleAgreement | null;
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
    this.segments = Int32Array.from(parts.assignment, (a) => a + 1);
    this.centers = parts.centers;
    this.k = parts.centers.length;
    this.medoids = parts.medoids;
    this.objective = parts.objective;
    this.fit = parts.fit;
    this.data = parts.data;
    this.ids = parts.data.ids;
    this.options = parts.options;
    this.dissimilarityUsed = parts.dissimilarity;
    this.mixture = parts.mixture;
    const sizes = new Array<number>(this.k).fill(0);
    let noiseCount = 0;
    for (let i = 0; i < parts.assignment.length; i++) {
      if (parts.assignment[i] < 0) noiseCount++;
      else sizes[parts.assignment[i]]++;
    }
    this.sizes = sizes;
    this.noiseCount = noiseCount;
    this.labels = parts.labels ?? 'fit';
    const notes = [...(parts.notes ?? [])];
    const agreement = this.ruleAgreement();
    if (agreement && agreement.reproduced < agreement.rows) {
      const how = this.method === 'hierarchy' ? 'a hierarchy cut' : this.method;
      notes.push(
        `The definition scores rows by the ${ruleWords(agreement.rule)} rule, ` +
          `which gives ${agreement.reproduced.toLocaleString('en-US')} of the ${agreement.rows.toLocaleString('en-US')} training rows ` +
          `the segment ${how} gave them (${(agreement.rows - agreement.reproduced).toLocaleString('en-US')} differ). The definition records ` +
          `this; call .relabelByRule() for a segmentation whose segments are the rule's own.`,
      );
    }
    this.notes = notes;
    // Inside the notebook a note is printed where the call was made; elsewhere it is on .notes.
    if (notes.length > 0 && insideNotebookKernel()) for (const n of notes) console.log(`kinsort note: ${n}`);
  }

  /** The metric the definition's rule compares with, or null when no definition can carry it (Gower). */
  private ruleMetric(): DefinitionMetric | null {
    if (this.method !== 'kmedoids') return 'euclidean';
    const m = (this.options.metric as string | undefined) ?? 'euclidean';
    return (DEFINITION_METRICS as readonly string[]).includes(m) ? (m as DefinitionMetric) : null;
  }

  /**
   * How many training rows the definition's rule (nearest centre, or nearest medoid for k-medoids)
   * gives the segment this segmentation gives them; null when no definition can be built (Gower).
   */
  ruleAgreement(): RuleAgreement | null {
    // Density segments have no nearest-centre rule (they can leave rows in no segment).
    if (this.method === 'density') return null;
    if (this.agreementCache === undefined) {
      const metric = this.ruleMetric();
      this.agreementCache = this.mixture
        ? mixtureAgreement(this.data.matrix, this.assignment, this.centers, this.mixture)
        : metric === null
          ? null
          : ruleAgreement(
              this.data.matrix,
              this.assignment,
              this.centers,
              metric,
              this.method === 'kmedoids' ? 'nearest-medoid' : 'nearest-center',
            );
    }
    return this.agreementCache;
  }

  /**
   * The same segments' centres (or medoids), with every training row relabelled by the definition's
   * own rule, so fit and rule agree on every row. Reported as such: the definition records labels
   * 'rule', and the write-up says so. Refused when a segment would be left without members.
   */
  relabelByRule(): Segmentation {
    const agreement = this.ruleAgreement();
    if (this.method === 'density') {
      throw new KinsortError(
        'relabelByRule: density segments have no nearest-centre rule to relabel by; their segments and noise are the fit itself.',
        'not-supported',
      );
    }
    if (agreement === null) {
      throw new KinsortError(
        `relabelByRule: this k-medoids segmentation uses the "${String(this.options.metric)}" metric, which a definition cannot carry, so there is no scoring rule to relabel by.`,
        'not-supported',
      );
    }
    if (agreement.reproduced === agreement.rows) return this;
    const assignment = agreement.ruleAssignment;
    const sizes = new Array<number>(this.k).fill(0);
    for (let i = 0; i < assignment.length; i++) sizes[assignment[i]]++;
    const empty = sizes.findIndex((s) => s === 0);
    if (empty >= 0) {
      throw new KinsortError(
        `relabelByRule: no training row is nearest segment ${empty + 1}'s ${this.method === 'kmedoids' ? 'medoid' : 'centre'}, so relabelling would leave it empty; cut or fit with another k.`,
        'bad-assignment',
      );
    }
    const moved = agreement.rows - agreement.reproduced;
    const objective =
      this.method === 'kmedoids' || this.mixture
        ? this.objective
        : { name: 'withinSS', value: withinAround(this.data.matrix, assignment, this.centers) };
    const relabelled = new Segmentation({
      method: this.method,
      options: this.options,
      assignment,
      centers: this.centers.map((c) => [...c]),
      medoids: this.medoids ? [...this.medoids] : undefined,
      fit: this.fit,
      objective,
      data: this.data,
      dissimilarity: this.dissimilarityUsed,
      labels: 'rule',
      mixture: this.mixture,
      notes: [
        this.mixture
          ? `Relabelled by the highest-posterior rule: ${moved.toLocaleString('en-US')} of ${agreement.rows.toLocaleString('en-US')} training rows ` +
            "moved to the component the stored rule gives them; weights, means and covariances are the fit's, unchanged."
          : `Relabelled by the ${ruleWords(agreement.rule)} rule: ${moved.toLocaleString('en-US')} of ` +
            `${agreement.rows.toLocaleString('en-US')} training rows moved to the segment whose ${this.method === 'kmedoids' ? 'medoid' : 'centre'} is nearest; ` +
            `the ${this.method === 'kmedoids' ? 'medoids' : 'centres'} are the fit's, unchanged.`,
      ],
    });
    for (const [s, n] of this.given) relabelled.name(s, n);
    return relabelled;
  }

  /** Give segment `segment` (1..k, as printed) a title and a write-up; returns this for chaining. */
  name(segment: number, name: SegmentName): this {
    this.checkSegment(segment, 'name');
    if (name === null || typeof name !== 'object') {
      throw new KinsortError(
        `name: give the segment's name as { title, text }, e.g. seg.name(${segment}, { title: 'Weekday commuters' }).`,
        'bad-option',
      );
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

  /** Segment number (1..k) of the row with this id; 0 when the row is noise (in no segment, density segments). */
  segmentOf(id: string): number {
    this.indexById ??= new Map(this.ids.map((v, i) => [v, i]));
    const i = this.indexById.get(String(id));
    if (i === undefined) {
      throw new KinsortError(
        `segmentOf: no prepared row has id "${id}" (dropped rows are listed in the preparation report).`,
        'bad-argument',
      );
    }
    return this.assignment[i] + 1;
  }

  /** Ids of the rows in no segment (noise; density segments only, else empty). */
  noiseMembers(): string[] {
    const out: string[] = [];
    for (let i = 0; i < this.assignment.length; i++) if (this.assignment[i] < 0) out.push(this.ids[i]);
    return out;
  }

  /** Ids of the rows in segment `segment` (1..k); noise rows are in none (see noiseMembers()). */
  members(segment: number): string[] {
    this.checkSegment(segment, 'members');
    const out: string[] = [];
    for (let i = 0; i < this.assignment.length; i++) if (this.assignment[i] === segment - 1) out.push(this.ids[i]);
    return out;
  }

  /** Silhouettes of every row (Rousseeuw 1987), in the space the segmentation was fitted in. */
  silhouette(): SilhouetteResult & Showable {
    this.requireTwo('silhouette');
    if (this.noiseCount > 0) return this.silhouetteWithoutNoise();
    this.silhouetteCache ??= this.dissimilarityUsed
      ? silhouette(this.dissimilarityUsed, this.assignment)
      : silhouette(this.data.matrix, this.assignment);
    const result = this.silhouetteCache;
    return showable({ ...result }, () => silhouetteView(result, this.assignment, { names: this.titles(), ids: this.ids }));
  }

  /**
   * Bootstrap stability of each segment (Hennig 2007): the mean Jaccard similarity between the
   * segment and its best match when the method is rerun on resampled rows.
   */
  stability(options: { resamples?: number; seed?: Seed; onProgress?: ProgressCallback } = {}): StabilityResult {
    const opts = checkOptions(options, ['resamples', 'seed', 'onProgress'], 'stability');
    if (this.method === 'density') {
      throw new KinsortError(
        'stability: bootstrap stability reruns k-means or k-medoids; density segments are not rerun on resamples. ' +
          'Compare density fits with other minSize / minSamples through compare(), or read the outlier scores on fit.',
        'not-supported',
      );
    }
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
      ...(this.mixture ? { covariance: this.mixture.covariance, restarts: (this.options.restarts as number | undefined) ?? 1 } : {}),
      assignment: this.assignment,
      onProgress: opts.onProgress,
    });
    return this.stabilityCache;
  }

  /** The numbers behind the cards, one profile per segment. */
  profiles(options: { top?: number } = {}): SegmentProfile[] {
    const opts = checkOptions(options, ['top'], 'profiles');
    const keepNames = new Set(this.data.preparation.keep);
    // Column names come from the data: null-prototype objects, so "__proto__" is a column like any other.
    const used: Record<string, readonly (number | string | null)[]> = Object.create(null);
    const keep: Record<string, readonly (number | string | null)[]> = Object.create(null);
    for (const [name, values] of Object.entries(this.data.profile.columns)) {
      (keepNames.has(name) ? keep : used)[name] = values;
    }
    const stab = this.stabilityCache;
    const agreement = this.ruleAgreement();
    // Noise rows get a profile of their own after the segments' (number k + 1, marked noise), so
    // cards and write-ups show them, never drop them.
    const names: Record<number, SegmentName> = this.names();
    if (this.noiseCount > 0) names[this.k + 1] = { title: NOISE_TITLE, text: NOISE_TEXT };
    const profiles = profileSegments({
      assignment: this.noiseCount > 0 ? Int32Array.from(this.assignment, (a) => (a < 0 ? this.k : a)) : this.assignment,
      features: this.data.matrix,
      ids: this.ids,
      used,
      keep,
      medoids: this.medoids,
      stability: stab ? { jaccard: stab.jaccard, reading: stab.reading } : undefined,
      names,
      top: opts.top,
    });
    if (this.noiseCount > 0) return profiles.map((p) => (p.index === this.k ? { ...p, noise: true } : p));
    if (agreement === null) return profiles;
    const rule = ruleWords(agreement.rule);
    return profiles.map((p) => ({ ...p, rule: { name: rule, reproduced: agreement.perSegment[p.index], size: p.size } }));
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
      noise: this.noiseCount > 0,
      ids: this.ids,
      centers: this.centers,
      names: this.titles(),
      loadings: opts.loadings,
      title: opts.title,
      ...(this.mixture ? { uncertain: { flags: this.membership().uncertain, below: this.mixture.uncertainBelow } } : {}),
    });
  }

  /**
   * Mixtures only: each row's membership probabilities (n × k, row-major), its top probability and
   * whether that is below the uncertainty threshold the projection marks.
   */
  membership(): MembershipTable {
    if (!this.mixture) {
      throw new KinsortError(
        `membership: a ${this.method} segmentation gives each row one segment, not probabilities; fit a Gaussian mixture (prepared.mixture({ k })) for memberships.`,
        'not-supported',
      );
    }
    return membershipTable(this.mixture, this.ids, this.k);
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
    if (this.noiseCount > 0) {
      // Noise is one more class for the tree (number k + 1, named so): its rules say who is in no segment.
      const titles = { ...this.titles(), [this.k + 1]: NOISE_TITLE };
      const assignment = Int32Array.from(this.assignment, (a) => (a < 0 ? this.k : a));
      return segmentRules(this.data, assignment, this.k + 1, titles, options);
    }
    return segmentRules(this.data, this.assignment, this.k, this.titles(), options);
  }

  /** Everything needed to reproduce and apply this segmentation to new rows. */
  definition(options: { note?: string } = {}): DefinitionHandle {
    const opts = checkOptions(options, ['note'], 'definition');
    if (this.method === 'density') return definitionHandle(this.densityDefinition(opts.note));
    const method = this.method;
    const names = this.names();
    const def = buildDefinition(
      {
        preparation: this.data.preparation,
        method: { name: method, options: this.options },
        centers: this.method === 'kmedoids' ? undefined : this.centers,
        mixture: this.mixture ? { weights: this.mixture.weights, covariances: this.mixture.covariances } : undefined,
        medoids: this.medoids ? [...this.medoids] : undefined,
        segments: this.sizes.map((size, s) => ({ number: s + 1, size, ...names[s + 1] })),
        training: { ids: this.ids, matrix: this.data.matrix, assignment: this.assignment },
        evidence: this.evidence(),
        note: opts.note,
        labels: this.labels,
      },
      'definition',
    );
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
    const html = (): string => writeUpPage(profiles, context, profileCardsView(profiles, { caution: false }));
    return {
      markdown,
      html,
      save: (path: string) => {
        // The one rule of every save (core/save-file.ts): folders made, failures name the path.
        const markdownFile = typeof path === 'string' && path.toLowerCase().endsWith('.md');
        saveText(path, markdownFile ? markdown() : html(), 'the write-up');
        return path;
      },
    };
  }

  /** @internal One sentence saying how this segmentation was made (the write-up and cards use it). */
  describeMethod(): string {
    const o = this.options;
    const rows = `${this.ids.length} rows, ${this.data.featureNames.length} prepared features (${this.data.preparation.scale} scaling)`;
    let how: string;
    switch (this.method) {
      case 'kmeans':
        how = `k-means with k = ${this.k}, ${o.restarts ?? 10} restarts, seed ${o.seed ?? 0}, on ${rows}.`;
        break;
      case 'kmedoids':
        how = `k-medoids (PAM) with k = ${this.k}, ${o.metric ?? 'euclidean'} dissimilarity, on ${rows}.`;
        break;
      case 'mixture':
        how = `Gaussian mixture (EM) with k = ${this.k}, ${o.covariance ?? 'full'} covariance, ${o.restarts ?? 1} restart(s), seed ${o.seed ?? 0}, on ${rows}.`;
        break;
      case 'density':
        how =
          `Density segments (HDBSCAN, minSize ${o.minSize}, minSamples ${o.minSamples}, ${o.metric ?? 'euclidean'}): ${this.k} segments ` +
          `and ${this.noiseCount.toLocaleString('en-US')} rows in no segment (noise), on ${rows}.`;
        return how;
      default:
        how = `Agglomerative hierarchy (${o.linkage} linkage, ${o.metric ?? 'euclidean'}) cut into ${this.k} segments, on ${rows}.`;
    }
    const a = this.ruleAgreement();
    if (a === null) return how;
    const rule = ruleWords(a.rule);
    if (this.labels === 'rule')
      return `${how} Segments relabelled by the ${rule} rule that scores new rows, so the two agree on every training row.`;
    if (a.reproduced === a.rows) return `${how} The ${rule} rule that scores new rows gives every training row its segment.`;
    return `${how} The ${rule} rule that scores new rows gives ${a.reproduced.toLocaleString('en-US')} of the ${a.rows.toLocaleString('en-US')} training rows their segment.`;
  }

  /** The figures that back the segmentation, for the definition file and the write-up. */
  // (ruleAgreement's count is in the definition's training.reproducedRows, not repeated here.)
  private evidence(): Record<string, unknown> {
    const out: Record<string, unknown> = { [this.objective.name]: this.objective.value };
    if (this.silhouetteCache) out.averageSilhouette = this.silhouetteCache.average;
    if (this.stabilityCache) out.stabilityJaccard = [...this.stabilityCache.jaccard];
    return out;
  }

  /** The nearest-dense-row definition: every training row in a segment stored with its core distance. */
  private densityDefinition(note: string | undefined) {
    const fit = this.fit as DensitySegmentsResult;
    const names = this.names();
    return buildDensityDefinition({
      preparation: this.data.preparation,
      options: this.options,
      metric: fit.metric,
      training: { ids: this.ids, matrix: this.data.matrix, assignment: this.assignment, coreDistances: fit.coreDistances },
      centers: this.centers.map((c) => [...c]),
      segments: this.sizes.map((_, s) => ({ ...names[s + 1] })),
      featureNames: this.data.featureNames,
      evidence: { ...this.evidence(), noiseRows: this.noiseCount },
      note,
    });
  }

  /** Silhouettes of the rows in a segment only: noise is no segment, so it has no silhouette. Stated on the result. */
  private silhouetteWithoutNoise(): SilhouetteResult & Showable & { noiseLeftOut: number } {
    const kept: number[] = [];
    for (let i = 0; i < this.assignment.length; i++) if (this.assignment[i] >= 0) kept.push(i);
    const assignment = Int32Array.from(kept, (i) => this.assignment[i]);
    const ids = kept.map((i) => this.ids[i]);
    this.silhouetteCache ??= silhouette(takeRows(this.data.matrix, kept), assignment);
    const result = this.silhouetteCache;
    const noiseLeftOut = this.noiseCount;
    return showable({ ...result, noiseLeftOut }, () => silhouetteView(result, assignment, { names: this.titles(), ids }));
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

/** Within-segment sum of squares around given centres (a relabelled segmentation keeps the fit's centres). */
function withinAround(m: import('../core/matrix').Matrix, assignment: Int32Array, centers: readonly (readonly number[])[]): number {
  let ss = 0;
  for (let i = 0; i < m.rows; i++) {
    const c = centers[assignment[i]];
    for (let j = 0; j < m.cols; j++) {
      const diff = m.data[i * m.cols + j] - c[j];
      ss += diff * diff;
    }
  }
  return ss;
}
