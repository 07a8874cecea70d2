import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render } from '@testing-library/react';
import type { ReactElement } from 'react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';

/** Renders a page at a path inside a memory router, with a fresh query client (no retries). */
export function renderAt(path: string, routes: Array<{ path: string; element: ReactElement }>) {
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  const view = render(
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return { ...view, router, queryClient };
}

export interface FakeResponse {
  status?: number;
  body?: unknown;
}

/** A fetch that answers from a table of `METHOD /path` handlers and records every call. */
export function fakeFetch(handlers: Record<string, (body: unknown) => FakeResponse>) {
  const calls: Array<{ method: string; path: string; body: unknown }> = [];
  const fetchImpl = async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = new URL(String(input), 'http://localhost');
    const method = init?.method ?? 'GET';
    const body = typeof init?.body === 'string' ? JSON.parse(init.body) : init?.body;
    calls.push({ method, path: url.pathname + url.search, body });
    const handler = handlers[`${method} ${url.pathname}`];
    const answer = handler ? handler(body) : { status: 404, body: { error: { code: 'not_found', message: `no fake for ${method} ${url.pathname}` } } };
    const status = answer.status ?? 200;
    return new Response(status === 204 ? null : JSON.stringify(answer.body ?? {}), { status, headers: { 'Content-Type': 'application/json' } });
  };
  return { fetchImpl, calls };
}
