import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createDataSource, MIGRATIONS, openDatabase } from '../../server/db/data-source';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, readFactoryPresets, seedDemo } from '../../server/seed/demo-seed';
import { validatePatch } from '../../shared/patch/validate-patch';
import { rowCount, startTestServer } from '../support/test-server';

const freshPath = () => join(mkdtempSync(join(tmpdir(), 'tautline-db-')), 'nested', 'tautline.sqlite');

describe('database', () => {
  it('migrates an empty file, and migrating twice in a row changes nothing', async () => {
    const path = freshPath();
    const first = await openDatabase(path);
    const tables = (await first.query(`SELECT name FROM sqlite_master WHERE type = 'table' ORDER BY name`)).map((row: { name: string }) => row.name);
    expect(tables).toEqual(expect.arrayContaining(['invitations', 'memberships', 'migrations', 'password_resets', 'presets', 'sessions', 'studios', 'users']));
    expect(await rowCount(first, 'migrations')).toBe(MIGRATIONS.length);
    expect(await first.runMigrations()).toEqual([]);
    await first.destroy();
    const second = await openDatabase(path);
    expect(await rowCount(second, 'migrations')).toBe(MIGRATIONS.length);
    await second.destroy();
  });

  it('runs in WAL mode with foreign keys enforced', async () => {
    const dataSource = await openDatabase(freshPath());
    expect(await dataSource.query('PRAGMA journal_mode')).toEqual([{ journal_mode: 'wal' }]);
    expect(await dataSource.query('PRAGMA foreign_keys')).toEqual([{ foreign_keys: 1 }]);
    await expect(dataSource.query(`INSERT INTO memberships (id, userId, studioId, role) VALUES ('m', 'no-user', 'no-studio', 'lead')`)).rejects.toThrow(/FOREIGN KEY/);
    await expect(dataSource.query(`INSERT INTO users (id, email, displayName, passwordHash) VALUES ('u', 'a@b.example', 'A', 'x')`)).resolves.toBeDefined();
    await expect(dataSource.query(`INSERT INTO users (id, email, displayName, passwordHash) VALUES ('v', 'a@b.example', 'B', 'x')`)).rejects.toThrow(/UNIQUE/);
    await dataSource.destroy();
  });

  it('never builds its schema by synchronising entities', () => {
    const dataSource = createDataSource(':memory:');
    expect(dataSource.options.synchronize).toBe(false);
  });
});

describe('demo seed', () => {
  it('seeds a fresh database once: the studio, one account per role, two sessions and every factory preset', async () => {
    const server = await startTestServer();
    try {
      expect(await seedDemo(server.dataSource, 10)).toBe(true);
      expect(await rowCount(server.dataSource, 'users')).toBe(4);
      expect(await rowCount(server.dataSource, 'sessions')).toBe(2);
      expect(await rowCount(server.dataSource, 'presets')).toBe(readFactoryPresets().length);
      const roles = await server.dataSource.query(`SELECT role FROM memberships ORDER BY role`);
      expect(roles.map((row: { role: string }) => row.role)).toEqual(['designer', 'lead', 'listener', 'producer']);
      // Each demo session's shape is a pluck with a handle: one part, and the polyline it makes, valid.
      for (const row of await server.dataSource.query(`SELECT patch FROM sessions`)) {
        const result = validatePatch(JSON.parse(row.patch));
        expect(result.ok).toBe(true);
        const patch = result.ok ? result.value : null;
        expect(patch?.excitation.parts).toEqual([expect.objectContaining({ kind: 'pluck', contact: 'fingertip' })]);
        const apex = patch!.excitation.displacementM.reduce((best, point) => (point[1] > best[1] ? point : best));
        expect(apex[0]).toBeCloseTo(patch!.excitation.parts![0].positionM, 9);
      }

      expect(await seedDemo(server.dataSource, 10)).toBe(false);
      expect(await rowCount(server.dataSource, 'users')).toBe(4);

      for (const account of DEMO_ACCOUNTS) {
        const login = await request(server.app).post('/api/auth/login').send({ email: account.email, password: DEMO_PASSWORD });
        expect(login.status, account.email).toBe(200);
      }
    } finally {
      await server.close();
    }
  });

  it('does not seed a database that already has users', async () => {
    const server = await startTestServer();
    try {
      await request(server.app).post('/api/auth/register').send({ email: 'first@saltglass.example', password: 'quiet-harbour-42', displayName: 'First' });
      expect(await seedDemo(server.dataSource, 10)).toBe(false);
      expect(await rowCount(server.dataSource, 'studios')).toBe(0);
    } finally {
      await server.close();
    }
  });
});
