// New project: you become its PI; add factors next under Settings.
import { useNavigate } from 'react-router-dom';
import { useCreateProject } from '@/features/projects/api/projects';
import { ProjectForm } from '@/features/projects/components/project-form';
import { PageHeader, Panel } from '@/components/ui/panel';

export default function ProjectNew() {
  const create = useCreateProject();
  const navigate = useNavigate();
  return (
    <div className="max-w-4xl">
      <PageHeader title="New project" subtitle="A development campaign with its own factors, builds and reference point. You become its PI." />
      <Panel>
        <ProjectForm pending={create.isPending} error={create.error} submitLabel="Create project" onSubmit={(v) => create.mutate(v, { onSuccess: (p) => navigate(`/projects/${p.id}/settings`) })} />
      </Panel>
    </div>
  );
}
