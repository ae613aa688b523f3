// Requests and answers of the designed-experiment routes: generate a design
// (POST /api/projects/:id/designs), plan its runs as builds (…/designs/plan), fit a response
// surface (…/surface) and propose the next builds (…/proposals).
import type { FactorDef } from '../schemas/project';
import type { Design, DesignRequest } from '../doe/designs/types';
import type { CanonicalAnalysis, ModelSpec, SurfaceFit } from '../doe/model/index';
import type { Proposal, ProposalConstraints, ProposalGoal, ProposalStrategy } from '../doe/proposals/index';
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
}

// ---------------------------------------------------------------------------------------------
// Surface

export interface SurfaceRequest {
  response: string;
  model: ModelSpec;
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
}

// ---------------------------------------------------------------------------------------------
// Proposals

export interface ProposalsRequest extends SurfaceRequest {
  goal?: ProposalGoal;
  count: number;
  strategy?: ProposalStrategy;
  constraints?: ProposalConstraints;
  seed?: number;
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
}
