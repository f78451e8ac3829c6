import { Link } from 'expo-router';
import { EmptyState } from '@/components/ui/states';
import { Text } from '@/components/ui/text';

export default function NotFound() {
  return (
    <EmptyState title="No such page" hint="The link may be old, or the item was deleted.">
      <Link href="/">
        <Text tone="copper" variant="strong">Go to your buildings</Text>
      </Link>
    </EmptyState>
  );
}
