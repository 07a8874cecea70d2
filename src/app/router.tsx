import { createBrowserRouter } from 'react-router-dom';
import { RouteError } from './route-error';

/**
 * Every page is its own chunk (route-level code splitting): the sign-in page loads no editor,
 * audio or canvas code.
 */
const page = (load: () => Promise<{ default: React.ComponentType }>) => async () => ({ Component: (await load()).default });

/** Shown for the instant before the first page's code arrives. */
function PageLoading() {
  return <div className="min-h-screen" aria-busy="true" />;
}

export function createAppRouter() {
  return createBrowserRouter([
    { path: '/sign-in', lazy: page(() => import('./routes/sign-in-page')), errorElement: <RouteError />, HydrateFallback: PageLoading },
    { path: '/register', lazy: page(() => import('./routes/register-page')), errorElement: <RouteError />, HydrateFallback: PageLoading },
    { path: '/forgot-password', lazy: page(() => import('./routes/forgot-password-page')), errorElement: <RouteError />, HydrateFallback: PageLoading },
    { path: '/reset-password', lazy: page(() => import('./routes/reset-password-page')), errorElement: <RouteError />, HydrateFallback: PageLoading },
    { path: '/invitations/accept', lazy: page(() => import('./routes/accept-invitation-page')), errorElement: <RouteError />, HydrateFallback: PageLoading },
    { path: '/dev/mailbox', lazy: page(() => import('./routes/mailbox-page')), errorElement: <RouteError />, HydrateFallback: PageLoading },
    {
      lazy: page(() => import('./routes/signed-in-layout')),
      errorElement: <RouteError />,
      HydrateFallback: PageLoading,
      children: [
        { path: '/', lazy: page(() => import('./routes/home-redirect')) },
        { path: '/studios/new', lazy: page(() => import('./routes/create-studio-page')) },
        { path: '/studios/:studioId', lazy: page(() => import('./routes/studio-home-page')) },
        { path: '/studios/:studioId/presets', lazy: page(() => import('./routes/presets-page')) },
        { path: '/studios/:studioId/renders', lazy: page(() => import('./routes/renders-page')) },
        { path: '/studios/:studioId/members', lazy: page(() => import('./routes/members-page')) },
        { path: '/sessions/:sessionId', lazy: page(() => import('./routes/session-page')) },
        { path: '/account', lazy: page(() => import('./routes/account-page')) },
        { path: '*', lazy: page(() => import('./routes/not-found-page')) },
      ],
    },
  ]);
}
