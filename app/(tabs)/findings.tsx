import { EmptyState } from '@/components/states';

export default function Findings() {
  return (
    <EmptyState
      title="No findings recorded"
      hint="Thermal readings, torque checks, trip tests and the deficiencies they raise will be listed here by priority, from P1 now to P4 watch, once inspections are recorded."
    />
  );
}
