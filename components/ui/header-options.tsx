import { SyncStatus } from '@/components/sync/sync-status';
import { colours, fonts } from './theme';

/** The header every navigator of the app shows: ink bar, paper text, the sync status on the right. */
export function headerOptions(withSyncStatus: boolean) {
  return {
    headerStyle: { backgroundColor: colours.ink },
    headerTintColor: colours.paper,
    headerTitleStyle: { fontFamily: fonts.textBold },
    headerRight: withSyncStatus ? () => <SyncStatus /> : undefined,
  };
}
