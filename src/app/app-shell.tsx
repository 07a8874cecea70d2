import type { ReactNode } from 'react';
import { NavLink, useMatch, useNavigate, useParams } from 'react-router-dom';
import type { MeResponse } from '../../shared/api/responses';
import { can } from '../../shared/access/roles';
import { ThemeToggle } from '../components/theme-toggle';
import { MasterVolume } from '../components/master-volume';
import { useSignOut } from '../features/auth/api/sign-out';
import { currentStudio, rememberStudio } from '../features/studios/current-studio';

const navClass = ({ isActive }: { isActive: boolean }) =>
  `shrink-0 whitespace-nowrap rounded-md px-2.5 py-2 text-sm font-semibold focus-visible:outline-2 focus-visible:outline-teal-400 ${
    isActive ? 'bg-brass-400/20 text-slate-950 dark:text-brass-300' : 'text-slate-700 hover:bg-slate-700/10 dark:text-slate-300 dark:hover:bg-slate-100/10'
  }`;

/**
 * The frame of every signed-in page: brand, studio switcher, the studio's sections, account, on one
 * row down to 1280 px. A session is a workbench: it gets the whole window below the header, and its
 * panes scroll inside it; every other page is a centred column that scrolls as a page.
 */
export function AppShell({ me, children }: { me: MeResponse; children: ReactNode }) {
  const { studioId } = useParams();
  const navigate = useNavigate();
  const signOut = useSignOut();
  const workbench = useMatch('/sessions/:sessionId') !== null;
  const studio = currentStudio(me, studioId);
  if (studio && studioId === studio.id) rememberStudio(studio.id);

  return (
    <div className={workbench ? 'flex h-dvh flex-col overflow-hidden' : 'min-h-screen'}>
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:rounded focus:bg-brass-400 focus:px-3 focus:py-2 focus:text-slate-950">
        Skip to content
      </a>
      <header className="shrink-0 border-b border-slate-700/15 bg-white/70 backdrop-blur dark:border-slate-300/10 dark:bg-slate-900/80">
        <div className={`mx-auto flex flex-nowrap items-center gap-2 py-2 ${workbench ? 'px-4' : 'max-w-7xl px-6'}`}>
          <NavLink to="/" className="mr-1 shrink-0 text-lg font-semibold tracking-tight focus-visible:outline-2 focus-visible:outline-teal-400">
            <span className="text-brass-600 dark:text-brass-400">Taut</span>line
          </NavLink>
          {me.studios.length > 0 && (
            <label className="flex min-w-0 items-center gap-2 text-sm">
              <span className="sr-only">Studio</span>
              <select
                value={studio?.id ?? ''}
                onChange={(event) => {
                  rememberStudio(event.target.value);
                  navigate(`/studios/${event.target.value}`);
                }}
                title={studio ? `${studio.name} (${studio.role})` : undefined}
                className="w-full max-w-52 truncate xl:max-w-72 rounded-md border border-slate-700/30 bg-white px-2 py-1.5 font-semibold dark:border-slate-300/20 dark:bg-slate-900"
              >
                {me.studios.map((option) => (
                  <option key={option.id} value={option.id}>
                    {option.name} ({option.role})
                  </option>
                ))}
              </select>
            </label>
          )}
          <nav aria-label="Studio sections" className="flex shrink-0 gap-0.5">
            {studio && (
              <>
                <NavLink end to={`/studios/${studio.id}`} className={navClass}>
                  Sessions
                </NavLink>
                <NavLink to={`/studios/${studio.id}/presets`} className={navClass}>
                  Presets
                </NavLink>
                <NavLink to={`/studios/${studio.id}/renders`} className={navClass}>
                  Renders
                </NavLink>
                {can(studio.role, 'manageMembers') && (
                  <NavLink to={`/studios/${studio.id}/members`} className={navClass}>
                    Members
                  </NavLink>
                )}
              </>
            )}
            <NavLink to="/studios/new" className={navClass}>
              New studio
            </NavLink>
          </nav>
          <div className="ml-auto flex min-w-0 items-center gap-1">
            <MasterVolume />
            <ThemeToggle />
            <NavLink to="/account" className={(state) => `${navClass(state)} max-w-40 truncate`} title={me.user.displayName}>
              {me.user.displayName}
            </NavLink>
            <button
              type="button"
              className="shrink-0 whitespace-nowrap rounded-md px-2.5 py-2 text-sm text-slate-700 hover:bg-slate-700/10 focus-visible:outline-2 focus-visible:outline-teal-400 dark:text-slate-300 dark:hover:bg-slate-100/10"
              onClick={() => signOut.mutate(undefined, { onSuccess: () => navigate('/sign-in') })}
            >
              Sign out
            </button>
          </div>
        </div>
      </header>
      <main id="main" className={workbench ? 'flex min-h-0 flex-1 flex-col px-3 pb-2 pt-2' : 'mx-auto max-w-7xl px-6 py-8'}>
        {children}
      </main>
    </div>
  );
}
