// What the client offers for a role, read from the one role × action table the server's guard
// enforces (shared/auth/permissions.ts): the client only hides what the server would refuse.
import type { Project } from '@shared/api-types';
import { buildPermissions, labHeldTo, roleAllows, type ProjectAction } from '@shared/auth/permissions';

type Role = Project['myRole'];

export const can = (role: Role, action: ProjectAction) => roleAllows(role, action);
/** create builds and upload curves (partners: for their own lab) */
export const canWrite = (role: Role) => roleAllows(role, 'createBuild');
export const canEditFactors = (role: Role) => roleAllows(role, 'editFactors');
export const canEditSettings = (role: Role) => roleAllows(role, 'editSettings');
export const canPlan = (role: Role) => roleAllows(role, 'plan');
export const canReview = (role: Role) => roleAllows(role, 'review');
/** The lab a person's new or edited build is held to (partners: their own), or null when any lab may be chosen. */
export const lockedLab = (role: Role, labId: number | null | undefined) => labHeldTo({ standing: role, labId: labId ?? null }, 'createBuild');
/** May this person upload curves to a build of that lab? */
export const canUploadTo = (role: Role, labId: number | null | undefined, buildLabId: number | null) => buildPermissions({ standing: role, labId: labId ?? null }, buildLabId).upload;
