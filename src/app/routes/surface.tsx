// Placeholder page until this feature lands.
import { useParams } from 'react-router-dom';
import { PageHeader, EmptyState } from '@/components/ui/panel';

export default function Page() {
  useParams();
  return (
    <div>
      <PageHeader title="Surface" />
      <EmptyState title="Coming with the next release">This page is being built.</EmptyState>
    </div>
  );
}
