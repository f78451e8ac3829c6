import { Building } from './building';
import { Circuit } from './circuit';
import { Membership } from './membership';
import { Organisation } from './organisation';
import { OwnerGrant } from './owner-grant';
import { Panel } from './panel';
import { User } from './user';

export { Building, Circuit, Membership, Organisation, OwnerGrant, Panel, User };
export const entities = [Organisation, User, Membership, OwnerGrant, Building, Panel, Circuit];
