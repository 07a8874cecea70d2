import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, type TestServer } from '../support/test-server';

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
});
afterAll(() => server.close());

describe('server basics', () => {
  it('answers GET /api/health with 200 {"ok":true}', async () => {
    const response = await request(server.app).get('/api/health');
    expect(response.status).toBe(200);
    expect(response.body).toEqual({ ok: true });
  });

  it('answers an unknown API route with a 404 error body', async () => {
    const response = await request(server.app).get('/api/nothing-here');
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
  });

  it('sends security headers (helmet)', async () => {
    const response = await request(server.app).get('/api/health');
    expect(response.headers['x-content-type-options']).toBe('nosniff');
    expect(response.headers['content-security-policy']).toContain("default-src 'self'");
    expect(response.headers['x-powered-by']).toBeUndefined();
  });
});
