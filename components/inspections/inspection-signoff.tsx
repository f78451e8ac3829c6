/** The sign-off of an inspection: inspectors and admins only, after a confirm; then it is frozen. */
import { Card } from '@/components/ui/card';
import type { Inspection } from '@/shared/records';
import { Button } from '@/components/ui/button';
import { signedLine } from './inspection-format';
import { Text } from '@/components/ui/text';

export function InspectionSignOff({
  inspection,
  readingCount,
  deficiencyCount,
  canSign,
  myId,
  onSign,
}: {
  inspection: Inspection;
  readingCount: number;
  deficiencyCount: number;
  canSign: boolean;
  myId: string | null;
  onSign: () => void;
}) {
  const signed = signedLine(inspection, myId);
  const tally = `${readingCount} reading${readingCount === 1 ? '' : 's'}, ${deficiencyCount} deficienc${deficiencyCount === 1 ? 'y' : 'ies'} raised.`;
  return (
    <Card size="row" strong testID="sign-off">
      <Text variant="label" tone="soft" heading={2} caps>
        Sign-off
      </Text>
      <Text variant="small">{tally}</Text>
      {signed ? (
        <Text variant="strong">✓ {signed}</Text>
      ) : canSign ? (
        <>
          <Text variant="small" tone="soft">
            Sign when every panel is done. Signing freezes this inspection; later changes need a new inspection.
          </Text>
          <Button label="Sign off inspection" onPress={onSign} testID="sign-inspection" />
        </>
      ) : (
        <Text variant="small" tone="soft">An inspector or an admin signs this inspection off.</Text>
      )}
    </Card>
  );
}
