/**
 * API tests run createApp() against the real PostgreSQL test cluster that `npm test` starts
 * (DATABASE_URL), on the demo scenario it seeded. Nothing here is mocked.
 */
import assert from 'node:assert/strict';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import { uuidv7 } from 'uuidv7';
import { formatHlc } from '../../shared/hlc';
import { SCHEMA_VERSION, type Mutation, type PushResponse } from '../../shared/sync';
import { createApp, type App } from '../../server/app';
import { readConfig, type Config } from '../../server/config';
import { makeDataSource } from '../../server/data-source';
import { DEMO_PASSWORD } from '../../scripts/demo-data';

export type RoleName = 'admin' | 'electrician' | 'inspector' | 'owner';
export const ROLES: RoleName[] = ['admin', 'electrician', 'inspector', 'owner'];

export interface TestContext {
  ds: DataSource;
  app: App;
  signIn(role: RoleName): Promise<request.Agent>;
  close(): Promise<void>;
}

/** The limits are high unless a test sets them: one address (loopback) makes every request here. */
export async function startApp(options: { signInLimit?: number; config?: Partial<Config> } = {}): Promise<TestContext> {
  const config = { ...readConfig(), ...options.config };
  const ds = await makeDataSource(config.DATABASE_URL).initialize();
  const app = createApp({
    dataSource: ds,
    config: {
      ...config,
      SIGN_IN_LIMIT: options.signInLimit ?? 10_000,
      SIGN_IN_ADDRESS_LIMIT: 10_000,
      RESET_LIMIT: 10_000,
      ...options.config,
    },
  });
  return {
    ds,
    app,
    async signIn(role) {
      const agent = request.agent(app);
      const res = await agent
        .post('/api/auth/sign-in')
        .send({ email: `${role}@ampwright.test`, password: DEMO_PASSWORD });
      if (res.status !== 200) throw new Error(`sign-in as ${role} failed: ${res.status}`);
      return agent;
    },
    async close() {
      await app.closeResources();
      await ds.destroy();
    },
  };
}

/** Rows by name from the seeded demo scenario. */
export async function demoIds(ds: DataSource) {
  const [clinic] = await ds.query(`SELECT id FROM building WHERE name LIKE '%Clinic%'`);
  const [lofts] = await ds.query(`SELECT id FROM building WHERE name LIKE '%Lofts%'`);
  const [clinicLA] = await ds.query(`SELECT id FROM panel WHERE building_id = $1 AND tag = 'LA'`, [clinic.id]);
  const [loftsPanel] = await ds.query(`SELECT id FROM panel WHERE building_id = $1 ORDER BY tag LIMIT 1`, [lofts.id]);
  const [cottagePanel] = await ds.query(`SELECT id FROM panel WHERE system = '120/240V-1ph-3w' LIMIT 1`);
  const circuitAt = async (panelId: string, position: number): Promise<string> => {
    const [row] = await ds.query(
      `SELECT id FROM circuit WHERE panel_id = $1 AND position = $2 AND deleted_at IS NULL`,
      [panelId, position],
    );
    return row.id;
  };
  return {
    clinicId: clinic.id as string,
    loftsId: lofts.id as string,
    clinicLAId: clinicLA.id as string,
    loftsPanelId: loftsPanel.id as string,
    cottagePanelId: cottagePanel.id as string,
    circuitAt,
  };
}

/** Another organisation with one building, panel and circuit that no demo user may see. */
export async function makeForeignOrganisation(ds: DataSource) {
  const organisationId = uuidv7();
  const buildingId = uuidv7();
  const panelId = uuidv7();
  const circuitId = uuidv7();
  const stamp = '2026-01-01T00:00:00.000Z-0000-test';
  await ds.query(`INSERT INTO organisation (id, name) VALUES ($1, 'Elsewhere Facilities')`, [organisationId]);
  await ds.query(
    `INSERT INTO building (id, organisation_id, name, updated_at, version) VALUES ($1, $2, 'Elsewhere Depot', $3, 1)`,
    [buildingId, organisationId, stamp],
  );
  await ds.query(
    `INSERT INTO panel (id, building_id, tag, kind, system, bus_rating_a, spaces, updated_at, version)
     VALUES ($1, $2, 'X1', 'panelboard', '208Y/120V-3ph-4w', 100, 30, $3, 1)`,
    [panelId, buildingId, stamp],
  );
  await ds.query(
    `INSERT INTO circuit (id, panel_id, building_id, position, poles, rating_a, breaker_type, description,
                          load_kind, status, updated_at, version)
     VALUES ($1, $2, $3, 1, 1, 20, 'standard', 'Depot lights', 'lighting', 'in-use', $4, 1)`,
    [circuitId, panelId, buildingId, stamp],
  );
  return { organisationId, buildingId, panelId, circuitId };
}

let lastWall = 0;
/** A device's HLC stamp on the real clock; every stamp a test file makes sorts after the one before. */
export function stamp(device: string, aheadMs = 0): string {
  const wall = Math.max(Date.now(), lastWall + 1);
  lastWall = wall;
  return formatHlc({ wallMs: wall + aheadMs, counter: 0, deviceId: device });
}

/** Pushes mutations as one device through `/api/sync/push`; the request itself must answer 200. */
export async function pushAs(agent: request.Agent, deviceId: string, mutations: Mutation[]): Promise<PushResponse['results']> {
  const res = await agent.post('/api/sync/push').send({ deviceId, schemaVersion: SCHEMA_VERSION, mutations });
  assert.equal(res.status, 200, JSON.stringify(res.body));
  return (res.body as PushResponse).results;
}
