import { ArcFlashLabel } from './arc-flash-label';
import { Building } from './building';
import { Circuit } from './circuit';
import { ConflictLog } from './conflict-log';
import { CurveBand } from './curve-band';
import { Deficiency } from './deficiency';
import { DeficiencyEntry } from './deficiency-entry';
import { Inspection } from './inspection';
import { Invitation } from './invitation';
import { Membership } from './membership';
import { OneTimeToken } from './one-time-token';
import { Organisation } from './organisation';
import { OwnerGrant } from './owner-grant';
import { Panel } from './panel';
import { Photo } from './photo';
import { ProcessedMutation } from './processed-mutation';
import { Reading } from './reading';
import { TripEvent } from './trip-event';
import { User } from './user';

export {
  ArcFlashLabel,
  Building,
  Circuit,
  ConflictLog,
  CurveBand,
  Deficiency,
  DeficiencyEntry,
  Inspection,
  Invitation,
  Membership,
  OneTimeToken,
  Organisation,
  OwnerGrant,
  Panel,
  Photo,
  ProcessedMutation,
  Reading,
  TripEvent,
  User,
};
export const entities = [
  Organisation,
  User,
  Membership,
  OwnerGrant,
  Building,
  Panel,
  Circuit,
  ConflictLog,
  ProcessedMutation,
  CurveBand,
  Inspection,
  Reading,
  Deficiency,
  DeficiencyEntry,
  TripEvent,
  Photo,
  ArcFlashLabel,
  Invitation,
  OneTimeToken,
];
