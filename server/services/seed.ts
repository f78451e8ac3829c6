import bcrypt from 'bcryptjs';
import type { DataSource, EntityManager } from 'typeorm';
import { uuidv7 } from 'uuidv7';
import {
  DEMO_BUILDINGS,
  DEMO_ORGANISATION,
  DEMO_OWNER_BUILDING_KEY,
  DEMO_PASSWORD,
  DEMO_USERS,
} from '../../scripts/demo-data';
import { Building, Circuit, Membership, Organisation, OwnerGrant, Panel, User } from '../entities';
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
        if (rows.length) await em.insert(Circuit, rows);
      }
    }
  });
  return true;
}

function depth(panels: { key: string; fedFromPanelKey: string | null }[], key: string): number {
  const panel = panels.find((p) => p.key === key);
  return panel?.fedFromPanelKey ? 1 + depth(panels, panel.fedFromPanelKey) : 0;
}
