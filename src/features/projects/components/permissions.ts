// What the client shows for a role; the server enforces the same rules (server/auth/access.ts).
import type { Project } from '@shared/api-types';

type Role = Project['myRole'];
export const canWrite = (role: Role) => role === 'admin' || role === 'pi' || role === 'researcher' || role === 'partner';
export const canEditFactors = (role: Role) => role === 'admin' || role === 'pi' || role === 'researcher';
export const canEditSettings = (role: Role) => role === 'admin' || role === 'pi';
export const canPlan = canEditFactors;
export const canReview = canEditSettings;
