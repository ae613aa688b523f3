// Requests and answers of the designed-experiment routes: generate a design
// (POST /api/projects/:id/designs), plan its runs as builds (…/designs/plan), fit a response
// surface (…/surface) and propose the next builds (…/proposals).
import type { FactorDef } from '../schemas/project';
import type { Design, DesignRequest } from '../doe/designs/types';
import type { CanonicalAnalysis, Effect, ModelChoice, ModelQuality, ModelSpec, ModelSupport, SupportCheck, SurfaceFit } from '../doe/model/index';
import type { BoundedValue, LimitContext } from '../doe/limits/index';
import type { Proposal, ProposalConstraints, ProposalGoal, ProposalStrategy } from '../doe/proposals/index';
import type { Build } from '../api-types';
import type { ResponseInfo } from './responses';

// ---------------------------------------------------------------------------------------------
// Designs

export interface DesignFactorChoice {
  key: string;
  /** a narrower (or wider) range for this design, in the factor's unit */
  low?: number;
  high?: number;
  /** a subset of the categorical levels */
  levels?: string[];
}

/** A design request over project factors, named by key or with a range / level choice. */
export type DesignBody = Omit<DesignRequest, 'factors'> & { factors: (string | DesignFactorChoice)[] };

/** The generated design (not stored) and the project factors it covers. */
export interface GeneratedDesign {
  design: Design;
  factors: FactorDef[];
}

export interface PlanRun {
  runOrder: number;
  block?: number;
  pointType?: string;
  standardOrder?: number;
  actual: Record<string, number | string>;
}

export interface PlanRunsBody {
  runs: PlanRun[];
  parentId?: number | null;
  /** lab of every run, unless its block has its own entry in labsByBlock */
  labId?: number | null;
  /** block number → lab id */
  labsByBlock?: Record<string, number>;
  loadingMgCm2?: number | null;
  areaCm2?: number | null;
  /** what the design is for, written into each build's change note */
  note?: string;
  /** design kind and seed, recorded in each build's notes so the plan can be traced */
  designKind?: string;
  seed?: number;
  /** values for the project factors the design does not vary, so every build carries every factor */
  held?: Record<string, number | string>;
  /** how the design was made (variant, α, centre points, blocks…), kept with the stored design */
  designSettings?: Record<string, unknown>;
}

/** A design whose runs were planned as builds (GET /api/projects/:id/designs). */
export interface StoredDesign {
  id: number;
  kind: string;
  seed: number | null;
  runCount: number;
  note: string;
  settings: Record<string, unknown>;
  createdAt: string;
  createdByName: string | null;
  builds: { id: number; code: string; status: string }[];
}

// ---------------------------------------------------------------------------------------------
// Surface

export interface SurfaceRequest {
  response: string;
  /** a model, or "auto": the simplest adequate model the builds support, chosen by leave-one-out error */
  model: ModelSpec | 'auto';
  /** factor keys to fit over; default every factor of the project */
  factors?: string[];
  /** builds to leave out of the fit (e.g. a known bad electrode) */
  exclude?: number[];
}

export interface SurfaceRun {
  buildId: number;
  code: string;
  labName: string | null;
  factors: Record<string, number | string>;
  observed: number;
  predicted: number;
  residual: number;
  leverage: number;
  /** observed − prediction from a fit without this build, e/(1 − h); null when h = 1 */
  looResidual: number | null;
}

/** Where the model has support: the ranges and levels built so far and the leverage limit. */
export interface TrustRegion {
  leverageLimit: number;
  ranges: { key: string; label: string; unit: string; low: number; high: number }[];
  levels: { key: string; label: string; levels: string[] }[];
}

export interface SurfaceResult {
  response: ResponseInfo;
  factors: FactorDef[];
  fit: SurfaceFit;
  runs: SurfaceRun[];
  skipped: { buildId: number; code: string; reason: string }[];
  /** project factors left out of a default fit, with the reason */
  omittedFactors: { key: string; reason: string }[];
  canonical: CanonicalAnalysis | null;
  /** highest observed value per continuous factor over all the project's builds (for safety cautions) */
  observedMax: Record<string, number>;
  /** gases used in the fitted builds' tests (e.g. "H2/air") */
  gases: string[];
  /** what was asked for and what was fitted: the chosen model and, for "auto", every candidate */
  model: { requested: 'auto' | 'linear' | 'interactions' | 'quadratic' | 'terms'; terms: string[]; termLabels: string[]; choice: ModelChoice | null };
  support: ModelSupport;
  quality: ModelQuality;
  /** each term's effect over its factor's range, largest first */
  effects: Effect[];
  /** physical limits of the response (for what-if predictions in the browser) */
  limits: LimitContext;
  trustRegion: TrustRegion;
}

// ---------------------------------------------------------------------------------------------
// Proposals

export interface ProposalsRequest extends SurfaceRequest {
  goal?: ProposalGoal;
  count: number;
  strategy?: ProposalStrategy;
  constraints?: ProposalConstraints;
  seed?: number;
  /** extra exploratory proposals, outside the trust region and labelled so (default 0) */
  exploratory?: number;
}

export interface ProposalItem extends Proposal {
  extrapolationReasons: string[];
  /** nearest observed (fitted) build in coded units, the natural parent of a planned build */
  nearest: { buildId: number; code: string; distance: number } | null;
  /** why a safety note applies to this proposal (empty when none) */
  cautions: string[];
}

export interface ProposalsResult {
  proposals: ProposalItem[];
  response: ResponseInfo;
  goal: ProposalGoal;
  strategy: ProposalStrategy;
  fit: { n: number; r2: number; rmse: number; predR2: number | null; warnings: string[] };
  /** the model the proposals came from */
  model: { terms: string[]; termLabels: string[]; looRmse: number | null };
}

/** "Plan this build" for one proposal: the fit it came from, the recipe, and a reason when it is flagged. */
export interface PlanProposalBody extends SurfaceRequest {
  recipe: Record<string, number | string>;
  /** required (a sentence) when the recipe is outside the builds' support or at a physical limit */
  reason?: string;
  parentId?: number | null;
  changeNote?: string;
}

export interface PlanProposalResult {
  build: Build;
  flagged: boolean;
  flags: string[];
  support: SupportCheck;
  limit: BoundedValue;
}
