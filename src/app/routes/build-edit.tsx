// Edit a build: the same form, filled with what is stored.
import { Navigate, useNavigate, useParams } from 'react-router-dom';
import { useFactors, useProject, useResponses } from '@/features/projects/api/projects';
import { useBuild, useBuildBriefs, useLabs, useUpdateBuild } from '@/features/builds/api/builds';
import { useLots } from '@/features/lots/api/lots';
import { BuildForm, buildToForm, cleanBuildInput } from '@/features/builds/components/build-form';
import { PageHeader, Loading, ErrorNote } from '@/components/ui/panel';
import { useMe } from '@/features/auth/api/get-me';
import { lockedLab } from '@/features/projects/components/permissions';

export default function BuildEdit() {
  const projectId = Number(useParams().projectId);
  const buildId = Number(useParams().buildId);
  const navigate = useNavigate();
  const project = useProject(projectId);
  const factors = useFactors(projectId);
  const responses = useResponses(projectId);
  const builds = useBuildBriefs(projectId);
  const build = useBuild(buildId);
  const labs = useLabs();
  const lots = useLots(projectId);
  const { data: me } = useMe();
  const update = useUpdateBuild(buildId, projectId);
  // edit a build under its own project's address, with that project's factors
  if (build.data && build.data.build.projectId !== projectId) return <Navigate to={`/projects/${build.data.build.projectId}/builds/${buildId}/edit`} replace />;
  if (project.isLoading || factors.isLoading || responses.isLoading || builds.isLoading || labs.isLoading || build.isLoading || lots.isLoading) return <Loading />;
  const error = project.error ?? factors.error ?? responses.error ?? builds.error ?? labs.error ?? build.error;
  if (error) return <ErrorNote error={error} />;
  const partnerLab = lockedLab(project.data?.myRole ?? null, me?.user.labId);
  const b = build.data!.build;

  return (
    <div className="max-w-5xl">
      <PageHeader eyebrow={project.data!.name} title={`Edit ${b.code}`} />
      <BuildForm
        factors={factors.data!}
        responses={responses.data!}
        labs={labs.data!}
        lots={lots.data ?? []}
        builds={builds.data!.filter((x) => x.id !== b.id)}
        lockLabId={partnerLab}
        initial={buildToForm(b)}
        submitLabel="Save changes"
        pending={update.isPending}
        serverError={update.error}
        onSubmit={(values) => update.mutate(cleanBuildInput(values), { onSuccess: () => navigate(`/projects/${projectId}/builds/${buildId}`) })}
      />
    </div>
  );
}
