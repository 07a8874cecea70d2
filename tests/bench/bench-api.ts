/** A JSON request to the app under measurement, as a signed-in person (Bearer token); a failure throws with the answer. */
export async function api(baseUrl: string, path: string, token: string, method = 'GET', body?: unknown) {
  const response = await fetch(`${baseUrl}${path}`, {
    method,
    headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  if (!response.ok) throw new Error(`${method} ${path}: ${response.status} ${await response.text()}`);
  return response.json();
}

/** Signs in through the API and returns the token. */
export async function logIn(baseUrl: string, email: string, password: string): Promise<string> {
  const response = await fetch(`${baseUrl}/api/auth/login`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ email, password }) });
  if (!response.ok) throw new Error(`login ${email}: ${response.status} ${await response.text()}`);
  return ((await response.json()) as { token: string }).token;
}
