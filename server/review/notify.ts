// E-mail notices to a project's PIs when a partner lab uploads curves or a build reaches
// "tested", and to a build's author when a PI gives a verdict. Every message goes through the
// mailer (so it lands in the outbox); people who turned notices off for the project get none.
// A failing mailer never fails the upload or update that triggered it.
import { and, eq, inArray, isNull } from 'drizzle-orm';
import type { AppContext, AuthUser } from '../context';
import type { ProjectAccess } from '../auth/access';
import { builds, labs, memberships, pendingNotices, projects, users } from '../db/schema';
import { escapeHtml } from '../lib/escape-html';
import type { CurveKind } from '../../shared/curves/types';
import { becameTested, nextStatus } from '../../shared/builds/status';
import { emailLinks } from '../lib/base-url';

type BuildRow = typeof builds.$inferSelect;



/** Members of a project with one of the roles who want notices, minus the person who acted. */
function recipients(ctx: AppContext, projectId: number, options: { roles?: ('pi' | 'researcher' | 'partner' | 'viewer')[]; userIds?: number[]; exclude: number | null }) {
  const conditions = [eq(memberships.projectId, projectId), eq(memberships.notify, true), isNull(users.disabledAt)];
  if (options.roles) conditions.push(inArray(memberships.role, options.roles));
  if (options.userIds) {
    if (options.userIds.length === 0) return [];
    conditions.push(inArray(users.id, options.userIds));
  }
  return ctx.db
    .select({ id: users.id, email: users.email, name: users.name, digest: memberships.digest, projectId: memberships.projectId })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(...conditions))
    .all()
    .filter((u) => u.id !== options.exclude);
}

async function sendAll(ctx: AppContext, to: { id: number; email: string; digest: boolean; projectId: number }[], message: { subject: string; text: string; html: string }) {
  for (const person of to) {
    if (person.digest) {
      // kept for the person's daily digest instead of an e-mail now
      ctx.db.insert(pendingNotices).values({ userId: person.id, projectId: person.projectId, subject: message.subject, text: message.text.split('\n\nTo stop these e-mails')[0]! }).run();
      continue;
    }
    try {
      await ctx.mailer.send({ to: person.email, ...message });
    } catch (error) {
      ctx.logger.warn({ err: error, to: person.email }, 'notice e-mail could not be sent');
    }
  }
}

function context(ctx: AppContext, build: BuildRow) {
  const project = ctx.db.select({ id: projects.id, name: projects.name }).from(projects).where(eq(projects.id, build.projectId)).get()!;
  const lab = build.labId != null ? ctx.db.select({ name: labs.name }).from(labs).where(eq(labs.id, build.labId)).get()?.name ?? null : null;
  const links = emailLinks(ctx.env);
  return { project, lab, link: links.build(project.id, build.id), settings: links.settings(project.id) };
}

function footer(settingsLink: string) {
  return {
    text: `\n\nTo stop these e-mails for this project, untick the notice box on the project's settings page: ${settingsLink}\n`,
    html: `<p style="color:#666;font-size:12px">To stop these e-mails for this project, untick the notice box on the <a href="${settingsLink}">project's settings page</a>.</p>`,
  };
}

/**
 * After a curve upload: the PIs hear of it when the uploader is a partner-lab member or when the
 * upload moved the build to "tested" (one e-mail per PI either way). `before` is the build as it
 * was before the upload.
 */
export async function notifyAfterUpload(ctx: AppContext, access: ProjectAccess, before: BuildRow, fileName: string, curve?: { kind: CurveKind; isRecord: boolean }): Promise<void> {
  try {
    const step = nextStatus(before.status, { kind: 'upload' });
    const nowTested = step.ok && becameTested(before.status, step.status);
    const fromPartner = access.role === 'partner';
    if (!nowTested && !fromPartner) return;
    const c = context(ctx, before);
    const to = recipients(ctx, before.projectId, { roles: ['pi'], exclude: access.user.id });
    if (to.length === 0) return;
    const who = `${access.user.name}${fromPartner && c.lab ? ` (${c.lab})` : ''}`;
    const state = nowTested ? ` ${before.code} is now tested and waiting for your review.` : '';
    // a later curve of a kind is stored beside the record; the build's values do not move
    const record = curve && !curve.isRecord ? ` It is not the ${curve.kind} curve of record: ${before.code}'s values are unchanged until someone chooses it on the build page.` : '';
    const f = footer(c.settings);
    await sendAll(ctx, to, {
      subject: `${before.code}: new curves uploaded${nowTested ? ' — ready for review' : ''} (${c.project.name})`,
      text: `${who} uploaded “${fileName}” to build ${before.code} in “${c.project.name}”.${state}${record}\n\nOpen the build: ${c.link}${f.text}`,
      html: `<p>${escapeHtml(who)} uploaded “${escapeHtml(fileName)}” to build <b>${escapeHtml(before.code)}</b> in “${escapeHtml(c.project.name)}”.${escapeHtml(state)}${escapeHtml(record)}</p><p><a href="${c.link}">Open ${escapeHtml(before.code)}</a></p>${f.html}`,
    });
  } catch (error) {
    ctx.logger.warn({ err: error }, 'upload notice failed');
  }
}

/** A build set to "tested" by hand (not by an upload, and not a restore from discarded). */
export async function notifyBuildTested(ctx: AppContext, actor: AuthUser, before: BuildRow, after: BuildRow): Promise<void> {
  try {
    if (!becameTested(before.status, after.status)) return;
    const c = context(ctx, after);
    const to = recipients(ctx, after.projectId, { roles: ['pi'], exclude: actor.id });
    const f = footer(c.settings);
    await sendAll(ctx, to, {
      subject: `${after.code} is tested — ready for review (${c.project.name})`,
      text: `${actor.name} marked build ${after.code} in “${c.project.name}” as tested.${after.changeNote ? `\nChange: ${after.changeNote}` : ''}\n\nOpen the build: ${c.link}${f.text}`,
      html: `<p>${escapeHtml(actor.name)} marked build <b>${escapeHtml(after.code)}</b> in “${escapeHtml(c.project.name)}” as tested.</p>${after.changeNote ? `<p>Change: ${escapeHtml(after.changeNote)}</p>` : ''}<p><a href="${c.link}">Open ${escapeHtml(after.code)}</a></p>${f.html}`,
    });
  } catch (error) {
    ctx.logger.warn({ err: error }, 'tested notice failed');
  }
}

/**
 * A reviewed build's curve of record changed (chosen, or the record deleted): the build is back
 * to "tested" and its values moved, so the PIs hear of it (each notice, daily digest or none,
 * as each chose). `build` is the build as it was before the change.
 */
export async function notifyRecordChanged(ctx: AppContext, actor: AuthUser, build: BuildRow, change: { kind: CurveKind; fromLabel: string | null; toLabel: string | null }): Promise<void> {
  try {
    const c = context(ctx, build);
    const to = recipients(ctx, build.projectId, { roles: ['pi'], exclude: actor.id });
    if (to.length === 0) return;
    const who = `${actor.name}${c.lab && actor.labId === build.labId ? ` (${c.lab})` : ''}`;
    const from = change.fromLabel ? `“${change.fromLabel}”` : 'none';
    const now = change.toLabel ? `“${change.toLabel}”` : 'none (no curve of this kind is left)';
    const f = footer(c.settings);
    const line = `${who} changed the ${change.kind} curve of record of build ${build.code} in “${c.project.name}”: ${from} → ${now}. The build's values changed, so it is back to tested and waiting for your review.`;
    await sendAll(ctx, to, {
      subject: `${build.code}: curve of record changed — back to review (${c.project.name})`,
      text: `${line}\n\nOpen the build: ${c.link}${f.text}`,
      html: `<p>${escapeHtml(line)}</p><p><a href="${c.link}">Open ${escapeHtml(build.code)}</a></p>${f.html}`,
    });
  } catch (error) {
    ctx.logger.warn({ err: error }, 'record notice failed');
  }
}

/** The build's author and operator hear of a PI's verdict. */
export async function notifyVerdict(ctx: AppContext, actor: AuthUser, build: BuildRow, verdict: 'approved' | 'needs-work', comment: string): Promise<void> {
  try {
    const authors = [...new Set([build.createdBy, build.operatorId].filter((id): id is number => id != null))];
    const c = context(ctx, build);
    const to = recipients(ctx, build.projectId, { userIds: authors, exclude: actor.id });
    const word = verdict === 'approved' ? 'approved' : 'needs work';
    const f = footer(c.settings);
    await sendAll(ctx, to, {
      subject: `${build.code} ${word} — review by ${actor.name} (${c.project.name})`,
      text: `${actor.name} reviewed build ${build.code} in “${c.project.name}”: ${word}.\n\n“${comment}”\n\nOpen the build: ${c.link}${f.text}`,
      html: `<p>${escapeHtml(actor.name)} reviewed build <b>${escapeHtml(build.code)}</b> in “${escapeHtml(c.project.name)}”: <b>${word}</b>.</p><blockquote>${escapeHtml(comment)}</blockquote><p><a href="${c.link}">Open ${escapeHtml(build.code)}</a></p>${f.html}`,
    });
  } catch (error) {
    ctx.logger.warn({ err: error }, 'verdict notice failed');
  }
}

/**
 * The daily digest: every person with waiting notices gets one e-mail listing them (grouped by
 * project), and the notices are marked sent. Returns how many digests went out.
 */
export async function sendDigests(ctx: AppContext): Promise<number> {
  const waiting = ctx.db
    .select({ id: pendingNotices.id, userId: pendingNotices.userId, email: users.email, name: users.name, projectName: projects.name, subject: pendingNotices.subject, text: pendingNotices.text, createdAt: pendingNotices.createdAt })
    .from(pendingNotices)
    .innerJoin(users, eq(users.id, pendingNotices.userId))
    .innerJoin(projects, eq(projects.id, pendingNotices.projectId))
    .where(and(isNull(pendingNotices.sentAt), isNull(users.disabledAt)))
    .orderBy(pendingNotices.id)
    .all();
  const byUser = new Map<number, typeof waiting>();
  for (const notice of waiting) byUser.set(notice.userId, [...(byUser.get(notice.userId) ?? []), notice]);
  let sent = 0;
  for (const notices of byUser.values()) {
    const first = notices[0]!;
    const lines = notices.map((n) => `• [${n.projectName}] ${n.subject}\n  ${n.text.replace(/\n+/g, '\n  ')}`);
    try {
      await ctx.mailer.send({
        to: first.email,
        subject: `Cellwright daily digest: ${notices.length} notice${notices.length === 1 ? '' : 's'}`,
        text: `Good morning ${first.name},\n\nSince the last digest:\n\n${lines.join('\n\n')}\n\nChoose one e-mail per event instead on each project's settings page.\n`,
        html: `<p>Good morning ${escapeHtml(first.name)},</p><p>Since the last digest:</p><ul>${notices.map((n) => `<li><b>[${escapeHtml(n.projectName)}]</b> ${escapeHtml(n.subject)}<br><span style="white-space:pre-wrap">${escapeHtml(n.text)}</span></li>`).join('')}</ul>`,
      });
      ctx.db.update(pendingNotices).set({ sentAt: new Date().toISOString() }).where(inArray(pendingNotices.id, notices.map((n) => n.id))).run();
      sent += 1;
    } catch (error) {
      ctx.logger.warn({ err: error, to: first.email }, 'digest e-mail could not be sent; kept for the next run');
    }
  }
  return sent;
}
