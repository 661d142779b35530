import { expect } from 'vitest';

/** A JSON call to a test server's API, with an optional bearer token. */
export async function apiCall(
  baseUrl: string,
  token: string | null,
  method: string,
  path: string,
  body?: unknown,
) {
  const res = await fetch(`${baseUrl}/api${path}`, {
    method,
    headers: {
      'content-type': 'application/json',
      ...(token ? { authorization: `Bearer ${token}` } : {}),
    },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const text = await res.text();
  // eslint-disable-next-line @typescript-eslint/no-explicit-any -- each test reads the answer it asked for
  return { status: res.status, text, json: text ? (JSON.parse(text) as any) : null };
}

/** Signs in through the API; the token and the user's id. */
export async function signInApi(baseUrl: string, email: string, password: string) {
  const res = await apiCall(baseUrl, null, 'POST', '/auth/login', { email, password });
  expect(res.status).toBe(200);
  return { token: res.json.token as string, id: res.json.user.id as string };
}
