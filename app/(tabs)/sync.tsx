import { EmptyState } from '@/components/states';

export default function Sync() {
  return (
    <EmptyState
      title="Everything is on the server"
      hint="Changes you make without a signal will wait here as “on this device” until they are synced; anything that needs review will be listed here too."
    />
  );
}
