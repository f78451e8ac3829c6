import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Card } from '@/components/ui/card';
import { keys } from '@/hooks/keys';
import { ApiError, api, describeError } from '@/lib/api';
import { PRIORITY_LABELS, PRIORITIES, organisationSettingsSchema, type OrganisationSettings } from '@/shared/records';
import type { Membership } from '@/shared/schemas';
import { fieldErrors } from '@/shared/schemas';
import { Button } from '@/components/ui/button';
import { TextField, ToggleField } from '@/components/ui/fields';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/theme';

/**
 * An admin's settings of the organisation: days to repair by priority (new deficiencies take
 * their due date from these) and whether uploaded photos keep their location. Saved online only:
 * the whole organisation shares them.
 */
export function OrganisationSettingsCard({ membership }: { membership: Membership }) {
  const queryClient = useQueryClient();
  const [days, setDays] = useState(() =>
    Object.fromEntries(PRIORITIES.map((p) => [p, String(membership.settings.dueDays[p])])) as Record<string, string>,
  );
  const [keepLocation, setKeepLocation] = useState(membership.settings.keepPhotoLocation);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const save = useMutation({
    networkMode: 'always',
    mutationFn: (settings: OrganisationSettings) =>
      api.patch(`/organisations/${membership.organisationId}/settings`, settings),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: keys.me }),
    onError: (error) => {
      if (error instanceof ApiError && error.fields) setErrors(error.fields);
    },
  });
  const onSave = () => {
    const candidate = {
      dueDays: Object.fromEntries(PRIORITIES.map((p) => [p, days[p].trim() === '' ? NaN : Number(days[p])])),
      keepPhotoLocation: keepLocation,
    };
    const parsed = organisationSettingsSchema.safeParse(candidate);
    if (!parsed.success) {
      setErrors(fieldErrors(parsed.error));
      return;
    }
    setErrors({});
    save.mutate(parsed.data);
  };
  return (
    <Card testID="organisation-settings">
      <Text variant="heading" heading={2}>
        {membership.organisationName}: settings
      </Text>
      <Text tone="soft">
        Days to repair a new deficiency, by priority: 0 is the day it is raised (P1 now). A lower priority is never due
        sooner than a higher one. Changing them does not move existing due dates.
      </Text>
      <View style={styles.grid}>
        {PRIORITIES.map((p) => (
          <View key={p} style={styles.cell}>
            <TextField
              label={`${PRIORITY_LABELS[p]} (days)`}
              value={days[p]}
              onChangeText={(v) => setDays((d) => ({ ...d, [p]: v }))}
              keyboardType="number-pad"
              mono
              error={errors[`dueDays.${p}`]}
              testID={`setting-due-${p}`}
            />
          </View>
        ))}
      </View>
      <ToggleField
        label="Keep location in uploaded photos"
        value={keepLocation}
        onChange={setKeepLocation}
        hint="Off: the server removes GPS and place names from every photo it stores."
      />
      {save.isError && !(save.error instanceof ApiError && save.error.fields) ? (
        <Text tone="danger" accessibilityRole="alert">
          {describeError(save.error)} Nothing was changed; try again with a connection.
        </Text>
      ) : null}
      {save.isSuccess && !save.isPending ? <Text testID="settings-saved">✓ Saved for everyone in the organisation.</Text> : null}
      <Button label="Save settings" tone="secondary" busy={save.isPending} onPress={onSave} testID="save-settings" />
    </Card>
  );
}

const styles = StyleSheet.create({
  grid: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  cell: { flexBasis: 140, flexGrow: 1 },
});
