// Every feature of the API, in the order its routes are matched. The app mounts these, the
// OpenAPI document lists their routes, and the role-matrix test walks them: a new route is a
// change in its feature's router.ts (plus its test), a new feature one line here.
import type { Feature, RouteDoc } from './lib/route';
import { authFeature } from './auth/router';
import { homeFeature } from './home/router';
import { projectsFeature } from './projects/router';
import { buildsFeature } from './builds/router';
import { curvesFeature } from './curves/router';
import { adminFeature } from './admin/router';
import { uploadsFeature } from './uploads/router';
import { doeFeature } from './doe/router';
import { gainsFeature } from './gains/router';
import { lineageFeature } from './lineage/router';
import { reviewFeature } from './review/router';
import { seriesFeature } from './series/router';
import { targetsFeature } from './targets/router';
import { lotsFeature } from './lots/router';
import { benchmarksFeature } from './benchmarks/router';

export const FEATURES: Feature[] = [authFeature, homeFeature, projectsFeature, buildsFeature, curvesFeature, adminFeature, uploadsFeature, doeFeature, gainsFeature, lineageFeature, reviewFeature, seriesFeature, targetsFeature, lotsFeature, benchmarksFeature];

/** Every documented route of every feature. */
export const ROUTES: RouteDoc[] = FEATURES.flatMap((feature) => feature.routes);
