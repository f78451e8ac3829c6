import bcrypt from 'bcryptjs';
import type { DataSource, EntityManager } from 'typeorm';
import { uuidv7 } from 'uuidv7';
import {
  DEMO_BUILDINGS,
  DEMO_ORGANISATION,
  DEMO_OWNER_BUILDING_KEY,
  DEMO_PASSWORD,
  DEMO_RECORD,
  DEMO_USERS,
} from '../../scripts/demo-data';
import { dueOnFor } from '../../shared/deficiency';
import {
  Building,
  Circuit,
  CurveBand,
  Deficiency,
  DeficiencyEntry,
  Inspection,
  Membership,
  Organisation,
  OwnerGrant,
  Panel,
  Reading,
  TripEvent,
  User,
} from '../entities';
import { insertRows } from './bulk';
import { serverStamp } from './clock';

/** Every field of a seeded row gets the same stamp, as if one device had typed it all at once. */
function stamped<T extends object>(fields: T, hlc: string) {
  const fieldMeta = Object.fromEntries(
    Object.keys(fields).map((k) => [k, { hlc, version: 1, device: 'seed' }]),
  );
  return { ...fields, updatedAt: hlc, updatedBy: null, deletedAt: null, version: '1', fieldMeta };
}

/** Loads the invented demo scenario into an empty database. Returns false if it was not empty. */
export async function seedDemo(ds: DataSource): Promise<boolean> {
  const existing = await ds.manager.count(Organisation);
  if (existing > 0) return false;
  const passwordHash = await bcrypt.hash(DEMO_PASSWORD, 10);
  await ds.transaction(async (em: EntityManager) => {
    const organisationId = uuidv7();
    await em.insert(Organisation, { id: organisationId, name: DEMO_ORGANISATION.name });

    const userIds = new Map<string, string>();
    for (const u of DEMO_USERS) {
      const id = uuidv7();
      userIds.set(u.role, id);
      await em.insert(User, { id, email: u.email.toLowerCase(), name: u.name, passwordHash });
      await em.insert(Membership, { id: uuidv7(), userId: id, organisationId, role: u.role });
    }

    const seeded = new Map<string, { buildingId: string; panelIds: Map<string, string>; circuitIds: Map<string, string> }>();
    for (const b of DEMO_BUILDINGS) {
      const hlc = serverStamp();
      const buildingId = uuidv7();
      await em.insert(Building, {
        id: buildingId,
        organisationId,
        ...stamped({ name: b.name, address: b.address, notes: b.notes }, hlc),
      });
      if (b.key === DEMO_OWNER_BUILDING_KEY) {
        await em.insert(OwnerGrant, { id: uuidv7(), userId: userIds.get('owner')!, buildingId });
      }
      const panelIds = new Map(b.panels.map((p) => [p.key, uuidv7()]));
      const circuitIds = new Map<string, string>();
      seeded.set(b.key, { buildingId, panelIds, circuitIds });
      // parents first so the fed-from foreign key always points at an inserted row
      const ordered = [...b.panels].sort(
        (x, y) => depth(b.panels, x.key) - depth(b.panels, y.key),
      );
      for (const p of ordered) {
        const { key, circuits: _circuits, fedFromPanelKey, ...fields } = p;
        await em.insert(Panel, {
          id: panelIds.get(key)!,
          buildingId,
          ...stamped(
            { ...fields, fedFromPanelId: fedFromPanelKey ? panelIds.get(fedFromPanelKey)! : null },
            hlc,
          ),
        });
      }
      for (const p of b.panels) {
        const rows = p.circuits.map(({ feedsPanelKey, ...c }) => ({
          id: uuidv7(),
          panelId: panelIds.get(p.key)!,
          buildingId,
          ...stamped({ ...c, feedsPanelId: feedsPanelKey ? panelIds.get(feedsPanelKey)! : null }, hlc),
        }));
        rows.forEach((row) => circuitIds.set(`${p.key}:${row.position}`, row.id));
        if (rows.length) await em.insert(Circuit, rows);
      }
    }
    const home = seeded.get(DEMO_RECORD.buildingKey)!;
    await seedRecord(em, home, userIds, organisationId);
  });
  return true;
}

/** The demo's inspections, readings, trips and deficiencies (DEMO_RECORD), dated from today. */
async function seedRecord(
  em: EntityManager,
  home: { buildingId: string; panelIds: Map<string, string>; circuitIds: Map<string, string> },
  userIds: Map<string, string>,
  organisationId: string,
) {
  const hlc = serverStamp();
  const r = DEMO_RECORD;
  // the band library (REST, not synced): invented demo bands, labelled so
  const bandIds = new Map(r.bands.map((b) => [b.key, uuidv7()]));
  for (const { key, ...band } of r.bands) {
    await em.insert(CurveBand, { id: bandIds.get(key)!, organisationId, ...band, updatedAt: new Date(), deletedAt: null });
  }
  const panelId = home.panelIds.get(r.panelKey)!;
  const circuitAt = (position: number | null, panelKey = r.panelKey) =>
    position === null ? null : home.circuitIds.get(`${panelKey}:${position}`)!;
  const day = (daysAgo: number) => new Date(Date.now() - daysAgo * 86_400_000);
  const isoDay = (daysAgo: number) => day(daysAgo).toISOString().slice(0, 10);
  const nameOf = (role: string) => DEMO_USERS.find((u) => u.role === role)!.name;
  const base = { buildingId: home.buildingId };

  const inspectionIds = new Map<string, string>();
  for (const i of r.inspections) {
    const id = uuidv7();
    inspectionIds.set(i.key, id);
    const signed = i.signed
      ? { signedAt: day(i.daysAgo), signedBy: userIds.get(i.by)!, signedByName: nameOf(i.by) }
      : { signedAt: null, signedBy: null, signedByName: null };
    await insertRows(em, Inspection, [Object.assign(new Inspection(), {
      id,
      ...base,
      inspectorId: userIds.get(i.by)!,
      inspectorName: nameOf(i.by),
      ...signed,
      ...stamped(
        { kind: i.kind, panelIds: [panelId], performedOn: isoDay(i.daysAgo), ambientC: i.ambientC, loadPct: i.loadPct, notes: i.notes },
        hlc,
      ),
    })]);
  }
  const readingIds = new Map<string, string>();
  for (const { inspectionKey, key, position, bandKey, ...fields } of r.readings) {
    const id = uuidv7();
    readingIds.set(key, id);
    const band = bandKey ? { bandId: bandIds.get(bandKey)! } : {};
    await insertRows(em, Reading, [Object.assign(new Reading(), {
      id,
      ...base,
      ...stamped({ inspectionId: inspectionIds.get(inspectionKey)!, panelId, circuitId: circuitAt(position), ...band, ...fields }, hlc),
    })]);
  }
  for (const t of r.trips) {
    const occurredAt = day(t.daysAgo);
    occurredAt.setUTCHours(t.hour, 0, 0, 0);
    await insertRows(em, TripEvent, [Object.assign(new TripEvent(), {
      id: uuidv7(),
      ...base,
      ...stamped({ panelId, circuitId: circuitAt(t.position)!, occurredAt, loadA: t.loadA, circumstances: t.circumstances }, hlc),
    })]);
  }
  const raisedDaysAgo = 20;
  for (const d of r.deficiencies) {
    const id = uuidv7();
    const dPanel = d.panelKey ? home.panelIds.get(d.panelKey)! : panelId;
    const fields = {
      panelId: dPanel,
      circuitId: circuitAt(d.position, d.panelKey),
      inspectionId: d.inspectionKey ? inspectionIds.get(d.inspectionKey)! : null,
      readingId: d.readingKey ? readingIds.get(d.readingKey)! : null,
      source: d.source,
      check: d.check ?? null,
      title: d.title,
      description: d.description,
      priority: d.priority,
      priorityReason: '',
      dueOn: dueOnFor(d.priority, isoDay(raisedDaysAgo)),
      status: d.status,
      assigneeId: d.assignTo ? userIds.get(d.assignTo)! : null,
      repairNote: '',
      deferReason: d.deferReason ?? '',
      reviewOn: d.reviewInDays ? isoDay(-d.reviewInDays) : null,
      acceptedAt: null,
    };
    await insertRows(em, Deficiency, [Object.assign(new Deficiency(), {
      id,
      ...base,
      raisedBy: userIds.get('inspector')!,
      raisedByName: nameOf('inspector'),
      ...stamped(fields, hlc),
    })]);
    const entry = (kind: 'change', text: string, changes: Record<string, [unknown, unknown]>, role: string, daysAgo: number) =>
      insertRows(em, DeficiencyEntry, [Object.assign(new DeficiencyEntry(), {
        id: uuidv7(),
        ...base,
        deficiencyId: id,
        kind,
        text,
        changes,
        userId: userIds.get(role)!,
        userName: nameOf(role),
        at: day(daysAgo),
        ...stamped({}, hlc),
      })]);
    await entry('change', 'raised', { title: [null, d.title], priority: [null, d.priority], status: [null, 'open'] }, 'inspector', raisedDaysAgo);
    if (d.status === 'scheduled') {
      await entry('change', '', { status: ['open', 'scheduled'], assigneeId: [null, fields.assigneeId] }, 'electrician', 18);
    }
    if (d.status === 'deferred') {
      await entry('change', '', { status: ['open', 'deferred'], deferReason: ['', d.deferReason], reviewOn: [null, fields.reviewOn] }, 'owner', 10);
    }
  }
}

function depth(panels: { key: string; fedFromPanelKey: string | null }[], key: string): number {
  const panel = panels.find((p) => p.key === key);
  return panel?.fedFromPanelKey ? 1 + depth(panels, panel.fedFromPanelKey) : 0;
}
