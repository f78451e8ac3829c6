import type { EntityManager } from 'typeorm';
import type { Actor } from '../auth/access';
import { NotFoundError } from '../http/errors';

/**
 * The write context every sync write runs in: who writes, with which stamp, from which device,
 * the building versions this push stamps rows with, and what the write reported (conflicts).
 * REST routes make one per request with a fresh server stamp; the sync push one per mutation,
 * sharing one VersionBook, so both paths obey the same rules.
 */

/** What a sync mutation adds to a write. REST writes have none: they cannot be concurrent. */
export interface SyncWrite {
  mutationId: string;
  /** version the device's copy was at (shared/sync.ts mutationSchema) */
  baseVersion: number;
  /** the building the mutation names; an entity elsewhere answers not found */
  buildingId: string;
}

/** Conflicts a write logged (ids of conflict_log rows). */
export interface WriteReport {
  conflictIds: string[];
}

export interface WriteContext {
  em: EntityManager;
  actor: Actor;
  /** HLC stamp of this write */
  hlc: string;
  /** device that made the write ('server' for REST calls) */
  device: string;
  /** the building versions this write stamps rows with; shared by all mutations of one push */
  versions: VersionBook;
  report: WriteReport;
  sync?: SyncWrite;
}

/** A write context; give it the push's VersionBook so a push bumps each building once. */
export function writeContext(
  em: EntityManager,
  actor: Actor,
  hlc: string,
  device: string,
  options: { versions?: VersionBook; sync?: SyncWrite } = {},
): WriteContext {
  return {
    em,
    actor,
    hlc,
    device,
    versions: options.versions ?? new VersionBook(em),
    report: { conflictIds: [] },
    sync: options.sync,
  };
}

// ---------- building versions ----------

/**
 * The version each touched building gets in one REST call or one push: bumped once, on first
 * use, with `UPDATE building SET version = version + 1 … RETURNING`. The row lock this takes
 * lasts until commit and orders concurrent writers of one building, so a pull (which reads the
 * building's version and its rows from one snapshot) can never pass a row that commits later with
 * a lower version.
 */
export class VersionBook {
  private versions = new Map<string, number>();
  private readonly homes = new Map<string, { id: string; organisationId: string }>();

  constructor(private readonly em: EntityManager) {}

  /** True when this book already holds the building's lock, so rows read since are current. */
  holds(buildingId: string): boolean {
    return this.versions.has(buildingId);
  }

  /** The version rows of the building are stamped with; the first call bumps it and locks the row. */
  async of(buildingId: string): Promise<number> {
    const known = this.versions.get(buildingId);
    if (known !== undefined) return known;
    // TypeORM answers an UPDATE … RETURNING on PostgreSQL as [rows, affectedCount]
    const [rows]: [{ version: string }[], number] = await this.em.query(
      'UPDATE building SET version = version + 1 WHERE id = $1 RETURNING version',
      [buildingId],
    );
    if (rows.length === 0) throw new NotFoundError('Building');
    const version = Number(rows[0].version);
    this.versions.set(buildingId, version);
    return version;
  }

  /** The version already assigned to the building, if any. */
  peek(buildingId: string): number | undefined {
    return this.versions.get(buildingId);
  }

  /** A building inserted by this write starts at version 1; nobody else can see it before commit. */
  created(buildingId: string): number {
    this.versions.set(buildingId, 1);
    return 1;
  }

  /**
   * Take the buildings a push locked and bumped before applying anything (server/sync/push.ts,
   * lockBuildings: in id order, so two pushes over the same buildings queue up instead of
   * deadlocking, and no bump happens inside a savepoint that a rejected mutation rolls back).
   */
  adopt(rows: readonly { id: string; organisation_id: string; version: string | number }[]): void {
    for (const row of rows) {
      this.versions.set(row.id, Number(row.version));
      this.homes.set(row.id, { id: row.id, organisationId: row.organisation_id });
    }
  }

  /** Organisation of a building this book adopted from the push's lock (it never changes). */
  home(buildingId: string): { id: string; organisationId: string } | undefined {
    return this.homes.get(buildingId);
  }

  /** Bumped versions so far, by building. */
  entries(): Map<string, number> {
    return new Map(this.versions);
  }

  /** Forget versions learned inside a savepoint that was rolled back. */
  restore(saved: Map<string, number>): void {
    this.versions = new Map(saved);
  }
}
