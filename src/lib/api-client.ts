import { ApiRequestError } from './api-error';

type Listener = () => void;
const unauthenticatedListeners = new Set<Listener>();

/** Called whenever a request answers 401, so the app can return to sign-in. */
export function onUnauthenticated(listener: Listener): () => void {
  unauthenticatedListeners.add(listener);
  return () => unauthenticatedListeners.delete(listener);
}

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PATCH' | 'DELETE';
  body?: unknown;
  formData?: FormData;
  signal?: AbortSignal;
}

/**
 * The one API client: JSON in and out under /api, the sign-in cookie sent along, the server's
 * error body turned into ApiRequestError, and 401 reported to the app.
 */
export async function apiRequest<T>(path: string, options: RequestOptions = {}): Promise<T> {
  let response: Response;
  try {
    response = await fetch(`/api${path}`, {
      method: options.method ?? 'GET',
      credentials: 'same-origin',
      headers: options.body !== undefined ? { 'Content-Type': 'application/json' } : undefined,
      body: options.formData ?? (options.body !== undefined ? JSON.stringify(options.body) : undefined),
      signal: options.signal,
    });
  } catch (error) {
    if ((error as Error).name === 'AbortError') throw error;
    throw new ApiRequestError(0, 'network', 'Cannot reach the Tautline server. Check the connection and try again.');
  }
  if (response.status === 204) return undefined as T;
  const text = await response.text();
  const body = text ? (JSON.parse(text) as unknown) : null;
  if (!response.ok) {
    const error = ApiRequestError.fromBody(response.status, body);
    if (response.status === 401 && !path.startsWith('/auth/')) for (const listener of unauthenticatedListeners) listener();
    throw error;
  }
  return body as T;
}
