// Seeds the invented demo lab into an empty database (idempotent: does nothing when people exist).
import { sql } from 'drizzle-orm';
import type { AppContext } from '../context';
import { benchmarks, builds, factors, labs, lots, memberships, projects, responseDefs, targets, users } from '../db/schema';
import { hashPassword } from '../auth/passwords';
import { DEMO_PASSWORD, LABS, PEOPLE, PROJECTS } from './demo-data';
import { addDemoCertificates, addDemoCurves, addDemoReference } from './demo-curves';

export async function seedIfEmpty(ctx: AppContext): Promise<boolean> {
  if (ctx.env.SEED_DEMO === 'never') return false;
  const count = ctx.db.select({ n: sql<number>`count(*)` }).from(users).get()!.n;
  if (count > 0) return false;
  await seedDemo(ctx);
  return true;
}

export async function seedDemo(ctx: AppContext): Promise<void> {
  const { db } = ctx;
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const labIds = new Map<string, number>();
  const userIds = new Map<string, number>();
  const jobs: Parameters<typeof addDemoCurves>[1][] = [];
  const references: { projectId: number; reference: NonNullable<(typeof PROJECTS)[number]['reference']> }[] = [];
  db.transaction((tx) => {
    for (const lab of LABS) labIds.set(lab.key, tx.insert(labs).values({ name: lab.name, kind: lab.kind, city: lab.city }).returning().get().id);
    for (const person of PEOPLE) {
      const row = tx.insert(users).values({ email: person.email, name: person.name, isAdmin: person.isAdmin, labId: labIds.get(person.lab)!, passwordHash }).returning().get();
      userIds.set(person.key, row.id);
    }
    for (const demo of PROJECTS) {
      const project = tx.insert(projects).values({ name: demo.name, description: demo.description, codePrefix: demo.codePrefix, settings: demo.settings, createdBy: userIds.get('pi')! }).returning().get();
      for (const [personKey, role] of Object.entries(demo.members)) tx.insert(memberships).values({ projectId: project.id, userId: userIds.get(personKey)!, role }).run();
      demo.factors.forEach((f, position) =>
        tx.insert(factors).values({ projectId: project.id, key: f.key, label: f.label, unit: f.unit, kind: f.kind, low: f.low ?? null, high: f.high ?? null, levels: f.levels ?? null, testVariable: f.testVariable ?? false, position }).run(),
      );
      for (const r of demo.responses) tx.insert(responseDefs).values({ projectId: project.id, ...r }).run();
      for (const t of demo.targets) tx.insert(targets).values({ projectId: project.id, ...t, basis: t.basis ?? null, createdBy: userIds.get('pi')! }).run();
      const lotIds = new Map<string, number>();
      for (const lot of demo.lots) lotIds.set(lot.name, tx.insert(lots).values({ projectId: project.id, ...lot, createdBy: userIds.get('pi')! }).returning().get().id);
      const codeToId = new Map<string, number>();
      for (const b of demo.builds) {
        const row = tx
          .insert(builds)
          .values({
            projectId: project.id,
            code: b.code,
            parentId: b.parent ? codeToId.get(b.parent)! : null,
            replicateOf: b.replicateOf ? codeToId.get(b.replicateOf)! : null,
            changeNote: b.changeNote ?? null,
            factorValues: b.factors,
            loadingMgCm2: b.loadingMgCm2,
            metalLoadingMgCm2: b.metalLoadingMgCm2 ?? null,
            areaCm2: b.areaCm2,
            catalystLot: b.lot,
            lotId: lotIds.get(b.lot) ?? null,
            labId: labIds.get(b.lab)!,
            operatorId: userIds.get(b.operator)!,
            testConditions: b.conditions,
            status: b.status,
            builtOn: b.builtOn,
            testedOn: b.testedOn ?? null,
            plannedOn: b.plannedOn ?? null,
            responseValues: b.responses ?? {},
            createdBy: userIds.get(b.operator)!,
            createdAt: `${b.builtOn}T09:00:00.000Z`,
          })
          .returning()
          .get();
        codeToId.set(b.code, row.id);
        if (b.status !== 'planned') jobs.push({ projectId: project.id, buildId: row.id, build: b, settings: demo.settings, uploadedBy: userIds.get(b.operator)! });
      }
      tx.insert(benchmarks).values({ projectId: project.id, buildId: codeToId.get(demo.benchmark.build)!, note: demo.benchmark.note, setBy: userIds.get('pi')! }).run();
      if (demo.reference) references.push({ projectId: project.id, reference: demo.reference });
    }
  });
  for (const job of jobs) await addDemoCurves(ctx, job);
  for (const r of references) await addDemoReference(ctx, r.projectId, userIds.get('pi')!, r.reference);
  for (const projectId of new Set(jobs.map((j) => j.projectId))) await addDemoCertificates(ctx, projectId, userIds.get('researcher')!);
  ctx.logger.info(`Seeded the demo lab: ${PEOPLE.length} people, ${PROJECTS.length} projects, ${PROJECTS.reduce((n, p) => n + p.builds.length, 0)} builds`);
}
