// The frame of every signed-in page: the ink-blue side rail with projects and admin links.
import { NavLink, Outlet, useLocation, useNavigate, useParams } from 'react-router-dom';
import { useEffect, useState } from 'react';
import type { ReactNode } from 'react';
import { useMe } from '@/features/auth/api/get-me';
import { useSignOut } from '@/features/auth/api/sign-in';
import { useProjects } from '@/features/projects/api/projects';
import { canPlan, canWrite } from '@/features/projects/components/permissions';
import { Logo } from '@/components/layout/logo';

function RailLink({ to, children, end, indent }: { to: string; children: ReactNode; end?: boolean; indent?: boolean }) {
  return (
    <NavLink
      to={to}
      end={end}
      className={({ isActive }) =>
        `flex items-center gap-2 rounded-md px-2.5 py-1.5 text-sm transition-colors ${indent ? 'ml-3 text-[13px]' : ''} ${
          isActive ? 'bg-ink-700 text-white' : 'text-ink-300 hover:bg-ink-800 hover:text-white'
        }`
      }
    >
      {children}
    </NavLink>
  );
}


export function AppShell() {
  const { data: me } = useMe();
  const { data: projects } = useProjects();
  const { projectId } = useParams();
  const signOut = useSignOut();
  const navigate = useNavigate();
  const current = projects?.find((p) => String(p.id) === projectId);
  const [open, setOpen] = useState(false);
  const location = useLocation();
  useEffect(() => setOpen(false), [location.pathname]);
  // the folded rail closes with Esc, like any overlay
  useEffect(() => {
    if (!open) return;
    const onKey = (e: KeyboardEvent) => { if (e.key === 'Escape') setOpen(false); };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [open]);

  return (
    <div className="flex min-h-screen flex-col md:flex-row">
      {/* narrow screens: a top bar whose button opens the rail over the page */}
      <div className="app-topbar sticky top-0 z-30 flex items-center justify-between bg-ink-900 px-4 py-2.5 md:hidden">
        <Logo />
        <button type="button" className="rounded-md px-2.5 py-1 text-sm text-ink-100 hover:bg-ink-800" aria-expanded={open} aria-controls="main-rail" onClick={() => setOpen((o) => !o)}>
          {open ? 'Close' : 'Menu'}
        </button>
      </div>
      <aside
        id="main-rail"
        className={`${open ? 'fixed inset-y-0 left-0 z-40 flex' : 'hidden'} h-screen w-64 shrink-0 flex-col bg-ink-900 px-3 py-4 shadow-xl md:sticky md:top-0 md:flex md:w-60 md:shadow-none`}
        aria-label="Main navigation"
      >
        <div className="mb-5 px-1.5"><Logo /></div>
        <nav className="flex flex-1 flex-col gap-0.5 overflow-y-auto">
          <RailLink to="/" end>Home</RailLink>
          <div className="mb-1 mt-4 px-2.5 text-[11px] font-semibold uppercase tracking-wider text-ink-300">Projects</div>
          {projects?.map((p) => (
            <div key={p.id}>
              <RailLink to={`/projects/${p.id}`} end>
                <span className="truncate" title={p.name}>{p.name}</span>
              </RailLink>
              {current?.id === p.id && (
                <div className="mb-1 mt-0.5 flex flex-col gap-0.5">
                  {canWrite(p.myRole) && <RailLink to={`/projects/${p.id}/upload`} indent>Upload</RailLink>}
                  <RailLink to={`/projects/${p.id}/compare`} indent>Compare curves</RailLink>
                  <RailLink to={`/projects/${p.id}/targets`} indent>Targets</RailLink>
                  <RailLink to={`/projects/${p.id}/benchmark`} indent>Benchmark</RailLink>
                  <RailLink to={`/projects/${p.id}/lots`} indent>Catalyst lots</RailLink>
                  <RailLink to={`/projects/${p.id}/lineage`} indent>Lineage</RailLink>
                  <RailLink to={`/projects/${p.id}/gains`} indent>Gains</RailLink>
                  <RailLink to={`/projects/${p.id}/durability`} indent>Durability</RailLink>
                  <RailLink to={`/projects/${p.id}/series`} indent>Series</RailLink>
                  {canPlan(p.myRole) && <RailLink to={`/projects/${p.id}/surface`} indent>Surface</RailLink>}
                  {canPlan(p.myRole) && <RailLink to={`/projects/${p.id}/plan`} indent>Plan</RailLink>}
                  <RailLink to={`/projects/${p.id}/review-pack`} indent>Review pack</RailLink>
                  <RailLink to={`/projects/${p.id}/settings`} indent>Settings</RailLink>
                </div>
              )}
            </div>
          ))}
          {me && me.user.labKind !== 'partner' && <RailLink to="/projects/new">+ New project</RailLink>}
          {me?.user.isAdmin && (
            <>
              <div className="mb-1 mt-4 px-2.5 text-[11px] font-semibold uppercase tracking-wider text-ink-300">Administration</div>
              <RailLink to="/admin/people">People</RailLink>
              <RailLink to="/admin/labs">Labs</RailLink>
              <RailLink to="/admin/outbox">Outbox</RailLink>
              <RailLink to="/admin/audit">Audit log</RailLink>
              <RailLink to="/admin/backups">Backups</RailLink>
            </>
          )}
        </nav>
        {me && (
          <div className="mt-3 border-t border-ink-700 pt-3 text-sm">
            <div className="truncate px-1.5 font-medium text-white">{me.user.name}</div>
            <div className="truncate px-1.5 text-xs text-ink-300">{me.user.email}</div>
            <NavLink to="/account" className="mt-2 block rounded-md px-2.5 py-1.5 text-sm text-ink-300 hover:bg-ink-800 hover:text-white">Sessions and API tokens</NavLink>
            <button
              type="button"
              className="mt-2 w-full rounded-md px-2.5 py-1.5 text-left text-sm text-ink-300 hover:bg-ink-800 hover:text-white"
              onClick={() => signOut.mutate(undefined, { onSettled: () => navigate('/sign-in') })}
            >
              Sign out
            </button>
          </div>
        )}
      </aside>
      {open && <div className="fixed inset-0 z-30 bg-ink-950/40 md:hidden" aria-hidden onClick={() => setOpen(false)} />}
      <main className="min-w-0 flex-1 px-4 py-5 md:px-8 md:py-6">
        <Outlet />
      </main>
    </div>
  );
}
