import { QueryClientProvider } from '@tanstack/react-query';
import { render } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter, RouterProvider, type RouteObject } from 'react-router-dom';
import { vi } from 'vitest';
import { apiErrorBody, type ApiErrorCode } from '../../../shared/api/error-body';
import type { MeResponse, MemberView, StudioSummary } from '../../../shared/api/responses';
import { createQueryClient } from '../../../src/lib/query-client';

/**
 * A small stand-in for the Tautline API in client tests: `fetch` answers the routes a test lists
 * (`"METHOD /api/path"`) and records every request with its JSON body. Unlisted routes answer 404.
 */
export interface FakeRequest {
  method: string;
  path: string;
  search: URLSearchParams;
  body: unknown;
}
export interface FakeAnswer {
  status: number;
  body?: unknown;
}
export type FakeRoute = FakeAnswer | ((request: FakeRequest) => FakeAnswer | Promise<FakeAnswer>);

/** An error answer shaped exactly as the server's (apiErrorBody: a blamed field always comes with its `issues`). */
export const apiError = (status: number, code: ApiErrorCode, message: string, field?: string): FakeAnswer => ({
  status,
  body: apiErrorBody(status, code, message, field),
});

export function fakeApi(routes: Record<string, FakeRoute>) {
  const requests: FakeRequest[] = [];
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const url = new URL(String(input), 'http://tautline.test');
    const method = init.method ?? 'GET';
    const request: FakeRequest = { method, path: url.pathname, search: url.searchParams, body: typeof init.body === 'string' ? JSON.parse(init.body) : undefined };
    requests.push(request);
    const route = routes[`${method} ${url.pathname}`];
    const answer = route === undefined ? apiError(404, 'not_found', `No fake route ${method} ${url.pathname}`) : typeof route === 'function' ? await route(request) : route;
    const text = answer.body === undefined ? null : JSON.stringify(answer.body);
    return new Response(answer.status === 204 ? null : text, { status: answer.status, headers: { 'Content-Type': 'application/json' } });
  });
  vi.stubGlobal('fetch', fetchMock);
  return {
    requests,
    /** The requests sent to one route, e.g. `sent('POST', '/api/invitations/accept')`. */
    sent: (method: string, path: string) => requests.filter((request) => request.method === method && request.path === path),
  };
}

/** Renders routes in a memory router inside the app's own query client, with a user-event session. */
export function renderRoutes(routes: RouteObject[], path: string) {
  const queryClient = createQueryClient();
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  const user = userEvent.setup();
  render(
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return { router, queryClient, user };
}

/** A stand-in page that names where the app went. */
export function Landing({ name }: { name: string }) {
  return <p>Landed on {name}</p>;
}

// Demo data of the invented studio Kestrel Lantern Audio.
export const STUDIO: StudioSummary = { id: 'studio-kla', name: 'Kestrel Lantern Audio', slug: 'kestrel-lantern-audio', role: 'lead', createdAt: '2025-11-02T09:00:00.000Z' };

export const WREN = { id: 'user-wren', email: 'wren@kestrel-lantern.example', displayName: 'Wren Halloway', createdAt: '2025-11-02T09:00:00.000Z' };

export function meAs(role: StudioSummary['role'], user = WREN, studios: StudioSummary[] = [{ ...STUDIO, role }]): MeResponse {
  return { user, studios };
}

export const member = (userId: string, displayName: string, email: string, role: MemberView['role'], lastSeenAt: string | null = '2025-12-01T16:30:00.000Z'): MemberView => ({
  userId,
  email,
  displayName,
  role,
  joinedAt: '2025-11-02T09:05:00.000Z',
  lastSeenAt,
});
