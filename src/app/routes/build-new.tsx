// New build: the form, starting from a parent's recipe when one is chosen.
import { useQuery } from '@tanstack/react-query';
import { useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { useFactors, useProject, useResponses } from '@/features/projects/api/projects';
import { buildQueryOptions, useBuildBriefs, useCreateBuild, useLabs } from '@/features/builds/api/builds';
import { useLots } from '@/features/lots/api/lots';
import { BuildForm, cleanBuildInput } from '@/features/builds/components/build-form';
import { PageHeader, Loading, ErrorNote } from '@/components/ui/panel';
import { useMe } from '@/features/auth/api/get-me';
import { lockedLab } from '@/features/projects/components/permissions';

export default function BuildNew() {
  const projectId = Number(useParams().projectId);
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const project = useProject(projectId);
  const factors = useFactors(projectId);
  const responses = useResponses(projectId);
  const builds = useBuildBriefs(projectId);
  const labs = useLabs();
  const lots = useLots(projectId);
  const { data: me } = useMe();
  const create = useCreateBuild(projectId);
  // ?parent=: the new build starts from that build's recipe, read on its own
  const parentId = params.get('parent') ? Number(params.get('parent')) : null;
  const parentDetail = useQuery({ ...buildQueryOptions(parentId ?? 0), enabled: parentId != null });
  if (project.isLoading || factors.isLoading || responses.isLoading || builds.isLoading || labs.isLoading || lots.isLoading || (parentId != null && parentDetail.isLoading)) return <Loading />;
  const error = project.error ?? factors.error ?? responses.error ?? builds.error ?? labs.error;
  if (error) return <ErrorNote error={error} />;
  const partnerLab = lockedLab(project.data?.myRole ?? null, me?.user.labId);
  const detail = parentDetail.data?.build;
  const parent = detail && detail.projectId === projectId ? detail : undefined;

  return (
    <div className="max-w-5xl">
      <PageHeader eyebrow={project.data!.name} title="New build" subtitle="Record the recipe as made. Curves are uploaded on the build page once it exists." />
      <BuildForm
        factors={factors.data!}
        responses={responses.data!}
        labs={labs.data!}
        lots={lots.data ?? []}
        builds={builds.data!}
        lockLabId={partnerLab}
        initial={parent ? { parentId: parent.id, factors: { ...parent.factors }, loadingMgCm2: parent.loadingMgCm2, metalLoadingMgCm2: parent.metalLoadingMgCm2, areaCm2: parent.areaCm2, catalystLot: parent.catalystLot, lotId: parent.lotId ?? null, testConditions: { ...parent.testConditions }, status: 'built', labId: partnerLab ?? parent.labId } : partnerLab ? { factors: {}, testConditions: { temperatureC: 180, anodeGas: 'H2', cathodeGas: 'air' }, status: 'built', areaCm2: 25, labId: partnerLab } : undefined}
        submitLabel="Create build"
        pending={create.isPending}
        serverError={create.error}
        onSubmit={(values) => create.mutate(cleanBuildInput(values), { onSuccess: (b) => navigate(`/projects/${projectId}/builds/${b.id}`) })}
      />
    </div>
  );
}
