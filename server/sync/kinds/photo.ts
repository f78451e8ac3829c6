import { PHOTO_PURPOSES_OF } from '../../../shared/records';
import type { MutationFields } from '../../../shared/sync';
import { Inspection, Photo, Reading } from '../../entities';
import { ValidationError } from '../../http/errors';
import { frozen, photoParent, remember } from './links';
import { createRecord, deleteRecord, patchRecord, planRecordPatches, type RecordSpec } from './record';
import type { MutationHandlers, PatchPlanners } from './types';

/**
 * Kind `photo`: the row of a photo of a reading (thermal or visible image), of a deficiency
 * (finding or repair), or of a circuit or a panel (the equipment: a breaker's marking, the labels); the bytes go up separately (server/services/photos.ts). A reading's photo
 * freezes with its signed inspection.
 */
export const photoSpec: RecordSpec<Photo, MutationFields<'photo.create'>, MutationFields<'photo.patch'>> = {
  kind: 'photo',
  entity: Photo,
  noun: 'Photo',
  write: 'inspection.record',
  async create(c, { parentKind, parentId, purpose }) {
    await photoParent(c, parentKind, parentId);
    const fits = PHOTO_PURPOSES_OF[parentKind];
    if (!fits.includes(purpose)) {
      throw new ValidationError({ purpose: `a ${parentKind} photo is ${fits.join(' or ')}` });
    }
    return { uploaded: false };
  },
  async checkChangeable(c, row) {
    // the caption and the row itself freeze with a signed inspection's reading
    if (row.parentKind !== 'reading') return;
    const signed = await remember(c, `photo-reading:${row.parentId}`, async () => {
      const reading = await c.w.em.findOne(Reading, { where: { id: row.parentId } });
      const inspection = reading && (await c.w.em.findOne(Inspection, { where: { id: reading.inspectionId } }));
      return !!inspection?.signedAt;
    });
    if (signed) throw frozen();
  },
};

export const photoMutations = {
  'photo.create': (w, m, fields) => createRecord(photoSpec, w, m.entityId, fields),
  'photo.patch': (w, m, fields) => patchRecord(photoSpec, w, m.entityId, fields),
  'photo.delete': (w, m) => deleteRecord(photoSpec, w, m.entityId),
} satisfies Partial<MutationHandlers>;

export const photoPlanners = {
  'photo.patch': (items) => planRecordPatches(photoSpec, items),
} satisfies PatchPlanners;
