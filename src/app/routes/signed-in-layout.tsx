import { useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { Navigate, Outlet, useLocation } from 'react-router-dom';
import { LoadingBlock } from '../../components/loading-block';
import { Notice } from '../../components/notice';
import { useMe } from '../../lib/queries/get-me';
import { onUnauthenticated } from '../../lib/api-client';
import { AppShell } from '../app-shell';

/** Every signed-in page: returns to sign-in (and back here afterwards) when the session ends. */
export default function SignedInLayout() {
  const me = useMe();
  const location = useLocation();
  const queryClient = useQueryClient();
  useEffect(() => onUnauthenticated(() => queryClient.setQueryData(['me'], null)), [queryClient]);

  if (me.isPending) {
    return (
      <div className="mx-auto max-w-5xl px-6 py-10">
        <LoadingBlock label="Checking your sign-in…" />
      </div>
    );
  }
  if (me.isError) {
    return (
      <div className="mx-auto max-w-xl px-6 py-16">
        <Notice tone="error" title="Cannot load your account">
          {me.error.message}
        </Notice>
      </div>
    );
  }
  if (!me.data) {
    const next = `${location.pathname}${location.search}`;
    return <Navigate to={`/sign-in?next=${encodeURIComponent(next)}`} replace />;
  }
  return (
    <AppShell me={me.data}>
      <Outlet />
    </AppShell>
  );
}
