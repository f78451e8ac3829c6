import { Building } from './building';
import { Circuit } from './circuit';
import { ConflictLog } from './conflict-log';
import { Membership } from './membership';
import { Organisation } from './organisation';
import { OwnerGrant } from './owner-grant';
import { Panel } from './panel';
import { ProcessedMutation } from './processed-mutation';
import { User } from './user';

export { Building, Circuit, ConflictLog, Membership, Organisation, OwnerGrant, Panel, ProcessedMutation, User };
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
];
