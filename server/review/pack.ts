// The review pack of a project: the waterfall of its best path, its best builds with their
// metrics, the durability summary and the builds still waiting for a verdict, for an optional
// date range — one answer for the page and the PDF alike.
import { desc, eq, inArray } from 'drizzle-orm';
import type { AppContext } from '../context';
import type { ProjectAccess } from '../auth/access';
import { projects, reviews, users } from '../db/schema';
import { listBuilds } from '../builds/service';
import { gainsFor } from '../gains/service';
import { durabilityComparison } from '../curves/durability';
import { listTargets } from '../targets/service';
import { AppError } from '../lib/errors';
import { daysWaiting } from './service';
import { CURVE_METRICS } from '../../shared/curves/metric-catalogue';
import type { Build, ReviewPack } from '../../shared/api-types';
import type { ReviewPackQuery } from '../../shared/schemas/review-pack';

const TOP_BUILDS = 5;

/** The day a build counts for in a date range: tested, else built, else recorded. */
function dayOf(build: Build): string {
  return build.testedOn ?? build.builtOn ?? build.plannedOn ?? new Date().toISOString().slice(0, 10);
}

export function reviewPack(ctx: AppContext, access: ProjectAccess, query: ReviewPackQuery, now = new Date()): ReviewPack {
  const project = ctx.db.select().from(projects).where(eq(projects.id, access.projectId)).get()!;
  const inPeriod = (build: Build) => {
    const day = dayOf(build);
    return (!query.from || day >= query.from) && (!query.to || day <= query.to);
  };
  const builds = listBuilds(ctx, access).filter((b) => b.status !== 'discarded' && inPeriod(b));
  const responseKey = 'vAtRef';
  const entry = CURVE_METRICS[responseKey];

  let gains: ReviewPack['gains'] = null;
  let gainsNote: string | null = null;
  try {
    gains = gainsFor(ctx, access, { response: responseKey });
    if (gains.steps.length < 2) gainsNote = 'Only the baseline has a value so far: no step to draw.';
  } catch (error) {
    if (!(error instanceof AppError)) throw error;
    gainsNote = error.message;
  }

  const topBuilds = builds
    .filter((b) => typeof b.values[responseKey] === 'number')
    .sort((a, b) => (b.values[responseKey] as number) - (a.values[responseKey] as number))
    .slice(0, TOP_BUILDS)
    .map((b) => ({ buildId: b.id, code: b.code, status: b.status, testedOn: b.testedOn, changeNote: b.changeNote, values: b.values }));

  const periodIds = new Set(builds.map((b) => b.id));
  const durability = durabilityComparison(ctx, access)
    .filter((row) => row.kind === 'durability' && row.isRecord && periodIds.has(row.buildId))
    .map((row) => ({ buildId: row.buildId, code: row.code, degradationRate: row.degradationRate, low: row.low, high: row.high, hoursRun: row.hoursRun, breakInHours: row.breakInHours }));

  const waiting = builds.filter((b) => b.status === 'tested');
  const comments = waiting.length
    ? ctx.db
        .select({ buildId: reviews.buildId, body: reviews.body, at: reviews.createdAt, author: users.name })
        .from(reviews)
        .innerJoin(users, eq(users.id, reviews.userId))
        .where(inArray(reviews.buildId, waiting.map((b) => b.id)))
        .orderBy(desc(reviews.id))
        .all()
    : [];
  const lastComment = new Map<number, (typeof comments)[number]>();
  for (const c of comments) if (!lastComment.has(c.buildId)) lastComment.set(c.buildId, c);
  const openThreads = waiting.map((b) => {
    const c = lastComment.get(b.id);
    return {
      buildId: b.id,
      code: b.code,
      testedOn: b.testedOn,
      waitingDays: daysWaiting(b.testedOn, now),
      lastComment: c ? { author: c.author, body: c.body, at: c.at } : null,
    };
  }).sort((a, b) => (b.waitingDays ?? -1) - (a.waitingDays ?? -1));

  return {
    project: { id: project.id, name: project.name, description: project.description, codePrefix: project.codePrefix, refCurrentDensity: project.settings.refCurrentDensity, refVoltage: project.settings.refVoltage },
    period: { from: query.from ?? null, to: query.to ?? null },
    generatedAt: now.toISOString(),
    response: { key: responseKey, label: entry.label, unit: entry.unit, goal: entry.goal },
    targets: listTargets(ctx, access),
    gains,
    gainsNote,
    topBuilds,
    durability,
    openThreads,
  };
}
