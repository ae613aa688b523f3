// Invented curves for the demo builds (filled in with the curves feature).
import type { AppContext } from '../context';
import type { DemoBuild } from './demo-data';
import type { ProjectSettings } from '../../shared/schemas/project';

export interface DemoCurveJob {
  projectId: number;
  buildId: number;
  build: DemoBuild;
  settings: ProjectSettings;
  uploadedBy: number;
}

export function addDemoCurves(_ctx: AppContext, _job: DemoCurveJob): void {}
