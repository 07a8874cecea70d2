import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';

describe('server', () => {
  it('answers GET /api/health with 200 {"ok":true}', async () => {
    const response = await request(createApp()).get('/api/health');
    expect(response.status).toBe(200);
    expect(response.body).toEqual({ ok: true });
  });

  it('answers an unknown API route with a 404 error body', async () => {
    const response = await request(createApp()).get('/api/nothing-here');
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
  });
});
