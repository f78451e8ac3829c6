import { Stack, useRouter } from 'expo-router';
import { useState } from 'react';
import { BandForm } from '@/components/register/band-form';
import { Screen } from '@/components/ui/screen';
import { useSaveBand } from '@/hooks/use-records';
import { useOnline } from '@/hooks/use-outbox';
import { ApiError, describeError } from '@/lib/api';

export default function NewBandScreen() {
  const router = useRouter();
  const save = useSaveBand();
  const online = useOnline();
  const [failure, setFailure] = useState<string | null>(null);
  return (
    <>
      <Stack.Screen options={{ title: 'New band' }} />
      <Screen wide>
        <BandForm
          saving={save.isPending}
          failure={failure}
          offline={!online}
          onSave={async (body) => {
            setFailure(null);
            // the save would only wait (paused) for a signal that may not come: say so now
            if (!online) {
              setFailure('No connection to the server: the band library needs one to save. Try again when you have signal.');
              return null;
            }
            try {
              await save.mutateAsync(body);
            } catch (error) {
              if (error instanceof ApiError && error.fields) return error.fields;
              setFailure(describeError(error));
              return null;
            }
            if (router.canGoBack()) router.back();
            else router.replace('/bands');
            return null;
          }}
        />
      </Screen>
    </>
  );
}
