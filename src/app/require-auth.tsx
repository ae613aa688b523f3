// Routes behind sign-in: waits for "who am I", sends strangers to /sign-in.
import { Navigate, Outlet, useLocation } from 'react-router-dom';
import { useMe } from '@/features/auth/api/get-me';
import { Loading } from '@/components/ui/panel';

export function RequireAuth() {
  const { data: me, isLoading } = useMe();
  const location = useLocation();
  if (isLoading) return <div className="p-8"><Loading /></div>;
  if (!me) return <Navigate to={`/sign-in?next=${encodeURIComponent(location.pathname + location.search)}`} replace />;
  return <Outlet />;
}
