import type { Role } from '../../shared/domain';
import type {
  Building as BuildingDto,
  Circuit as CircuitDto,
  Panel as PanelDto,
} from '../../shared/schemas';
import type { Conflict as ConflictDto } from '../../shared/sync';
import type { Building, Circuit, ConflictLog, Panel } from '../entities';
import type { SyncColumns } from '../entities/sync-columns';

function syncColumns(row: SyncColumns) {
  return {
    id: row.id,
    updatedAt: row.updatedAt,
    updatedBy: row.updatedBy,
    deletedAt: row.deletedAt ? row.deletedAt.toISOString() : null,
    version: Number(row.version),
  };
}

export function buildingDto(b: Building, role: Role, panelCount: number): BuildingDto {
  return {
    ...syncColumns(b),
    organisationId: b.organisationId,
    name: b.name,
    address: b.address,
    notes: b.notes,
    role,
    panelCount,
  };
}

export function panelDto(p: Panel): PanelDto {
  return {
    ...syncColumns(p),
    buildingId: p.buildingId,
    tag: p.tag,
    location: p.location,
    kind: p.kind,
    system: p.system,
    busRatingA: p.busRatingA,
    mainRatingA: p.mainRatingA,
    shortCircuitKA: p.shortCircuitKA,
    availableFaultKA: p.availableFaultKA,
    availableFaultOn: p.availableFaultOn,
    availableFaultSource: p.availableFaultSource,
    seriesRated: p.seriesRated,
    seriesRatingNote: p.seriesRatingNote,
    feederRatingA: p.feederRatingA,
    peakDemand: p.peakDemand,
    peakDemandUnit: p.peakDemandUnit,
    peakDemandBasis: p.peakDemandBasis,
    peakDemandOn: p.peakDemandOn,
    measuredA: p.measuredA,
    measuredB: p.measuredB,
    measuredC: p.measuredC,
    measuredN: p.measuredN,
    measuredOn: p.measuredOn,
    terminationTempC: p.terminationTempC,
    spaces: p.spaces,
    fedFromPanelId: p.fedFromPanelId,
    fedFromPosition: p.fedFromPosition,
    maker: p.maker,
    model: p.model,
    installedOn: p.installedOn,
    condition: p.condition,
  };
}

export function circuitDto(c: Circuit): CircuitDto {
  return {
    ...syncColumns(c),
    panelId: c.panelId,
    position: c.position,
    poles: c.poles,
    ratingA: c.ratingA,
    breakerType: c.breakerType,
    description: c.description,
    loadKind: c.loadKind,
    loadVA: c.loadVA,
    continuous: c.continuous,
    conductorSize: c.conductorSize,
    conductorMaterial: c.conductorMaterial,
    insulationTempC: c.insulationTempC,
    terminationTempC: c.terminationTempC,
    lengthFt: c.lengthFt,
    status: c.status,
    feedsPanelId: c.feedsPanelId,
    handleLock: c.handleLock,
    notes: c.notes,
    bandId: c.bandId,
    interruptingKA: c.interruptingKA,
    breakerMake: c.breakerMake,
    catalogueNumber: c.catalogueNumber,
    ambientC: c.ambientC,
    currentCarrying: c.currentCarrying,
    verifiedOn: c.verifiedOn,
    verifiedBy: c.verifiedBy,
  };
}

/**
 * A conflict_log row for review. `names` maps user ids to display names, so the device can say who
 * won and who lost while offline.
 */
export function conflictDto(c: ConflictLog, names: ReadonlyMap<string, string>): ConflictDto {
  return {
    ...syncColumns(c),
    buildingId: c.buildingId,
    entity: c.entity,
    entityId: c.entityId,
    field: c.field,
    winnerValue: c.winnerValue ?? {},
    loserValue: c.loserValue ?? {},
    winnerHlc: c.winnerHlc,
    loserHlc: c.loserHlc,
    winnerUser: c.winnerUser,
    loserUser: c.loserUser,
    winnerUserName: c.winnerUser ? (names.get(c.winnerUser) ?? null) : null,
    loserUserName: c.loserUser ? (names.get(c.loserUser) ?? null) : null,
    loserDevice: c.loserDevice,
    mutationId: c.mutationId,
    kind: c.kind,
    resolution: c.resolution,
  };
}

/**
 * A condition-record row as synced: every column but field_meta, dates as ISO text and the
 * version as a number (the row types are in shared/records.ts).
 */
export function recordDto(row: SyncColumns): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(row)) {
    if (key === 'fieldMeta') continue;
    out[key] = value instanceof Date ? value.toISOString() : value;
  }
  out.version = Number(row.version);
  return out;
}
