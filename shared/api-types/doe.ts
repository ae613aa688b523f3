// Answers of the designed-experiment routes: generate a design (POST /api/projects/:id/designs),
// plan its runs as builds (…/designs/plan), fit a response surface (…/surface) and propose the
// next builds (…/proposals). Their request bodies are the zod schemas of shared/schemas/doe.
import type { FactorDef } from '../schemas/project';
import type { Design } from '../doe/designs/types';
import type { CanonicalAnalysis, Effect, ModelChoice, ModelQuality, ModelSupport, SupportCheck, SurfaceFit } from '../doe/model/index';
import type { BoundedValue, LimitContext } from '../doe/limits/index';
import type { Proposal, ProposalGoal, ProposalStrategy } from '../doe/proposals/index';
import type { ResponseInfo } from './responses';

export type { DesignBody, DesignFactorChoice, PlanProposalBody, PlanRun, PlanRunsBody, ProposalsRequest, SurfaceRequest } from '../schemas/doe';

// ---------------------------------------------------------------------------------------------
// Designs

/** The generated design (not stored) and the project factors it covers. */
export interface GeneratedDesign {
  design: Design;
  factors: FactorDef[];
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
