/**
 * `GET /api/panels/:id` is built in one statement by server/services/panel-read.ts. Its answer must
 * be the one the row DTOs of server/services/serialise.ts give for the same rows, for every demo
 * panel, including odd values (a deleted circuit left out, fractions, a date, nulls); another
 * organisation's panel and a missing one answer 404 alike.
 */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { uuidv7 } from 'uuidv7';
import { IsNull } from 'typeorm';
import { Building, Circuit, Panel } from '../../server/entities';
import { buildingDto, circuitDto, panelDto } from '../../server/services/serialise';
import { demoIds, makeForeignOrganisation, startApp, type TestContext } from './context';

let ctx: TestContext;

before(async () => {
  ctx = await startApp();
});
after(async () => ctx.close());

async function expected(panelId: string, role: 'electrician') {
  const em = ctx.ds.manager;
  const panel = await em.findOneByOrFail(Panel, { id: panelId });
  const building = await em.findOneByOrFail(Building, { id: panel.buildingId });
  const count = await em.countBy(Panel, { buildingId: building.id, deletedAt: IsNull() });
  const circuits = await em.find(Circuit, { where: { panelId, deletedAt: IsNull() }, order: { position: 'ASC' } });
  return { panel: panelDto(panel), building: buildingDto(building, role, count), circuits: circuits.map(circuitDto) };
}

describe('GET /api/panels/:id', () => {
  it('answers what the row DTOs give, for every demo panel', async () => {
    const agent = await ctx.signIn('electrician');
    const ids = await demoIds(ctx.ds);
    // values the JSON built by PostgreSQL must carry exactly as the DTOs do
    const odd = await ids.circuitAt(ids.clinicLAId, 1);
    await ctx.ds.query(`UPDATE circuit SET load_va = 363.000362, length_ft = 0.1 + 0.2 WHERE id = $1`, [odd]);
    await ctx.ds.query(`UPDATE panel SET installed_on = '1987-03-09', short_circuit_ka = 10.5 WHERE id = $1`, [ids.clinicLAId]);
    const gone = await ids.circuitAt(ids.clinicLAId, 3);
    await ctx.ds.query(`UPDATE circuit SET deleted_at = now() WHERE id = $1`, [gone]);
    try {
      const panels: { id: string }[] = await ctx.ds.query(
        `SELECT p.id FROM panel p JOIN building b ON b.id = p.building_id
         WHERE p.deleted_at IS NULL AND b.organisation_id = (SELECT organisation_id FROM building WHERE id = $1)`,
        [ids.clinicId],
      );
      assert.ok(panels.length >= 3, 'the demo has several panels');
      for (const { id } of panels) {
        const res = await agent.get(`/api/panels/${id}`);
        assert.equal(res.status, 200, JSON.stringify(res.body));
        assert.deepEqual(res.body, JSON.parse(JSON.stringify(await expected(id, 'electrician'))), `panel ${id}`);
      }
      const la = await agent.get(`/api/panels/${ids.clinicLAId}`);
      assert.ok(!la.body.circuits.some((c: { id: string }) => c.id === gone), 'a deleted circuit is not sent');
      assert.equal(la.body.circuits.find((c: { id: string }) => c.id === odd).loadVA, 363.000362);
      assert.equal(la.body.panel.installedOn, '1987-03-09');
    } finally {
      await ctx.ds.query(`UPDATE circuit SET deleted_at = NULL WHERE id = $1`, [gone]);
    }
  });

  it('answers 404 alike for another organisation’s panel, a deleted one and one that never was', async () => {
    const agent = await ctx.signIn('electrician');
    const foreign = await makeForeignOrganisation(ctx.ds);
    const missing = await agent.get(`/api/panels/${uuidv7()}`);
    const other = await agent.get(`/api/panels/${foreign.panelId}`);
    assert.equal(missing.status, 404);
    assert.equal(other.status, 404);
    assert.deepEqual(other.body, missing.body);
  });
});
