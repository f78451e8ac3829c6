/**
 * The photos of a deficiency: what was found ('finding') and the evidence of the repair
 * ('repair'). One place that binds the deficiency screens to the shared photo strip.
 */
import { PhotoStrip } from '@/components/documents/photos';

export function DeficiencyPhotos({
  buildingId,
  deficiencyId,
  purpose,
  canAdd,
  label,
}: {
  buildingId: string;
  deficiencyId: string;
  purpose: 'finding' | 'repair';
  canAdd: boolean;
  label: string;
}) {
  return <PhotoStrip buildingId={buildingId} parentKind="deficiency" parentId={deficiencyId} purpose={purpose} canAdd={canAdd} label={label} />;
}
