// On a vehicle: readiness snapshots from all its cases, so the last known state is at hand.
import { Loaded } from '../ui/states';
import { Card } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { useTheme } from '../theme/use-theme';
import { useVehicleReadiness } from './api';
import { SnapshotList } from './snapshot-list';

export function VehicleReadinessPanel({ vehicleId }: { vehicleId: number }) {
  const t = useTheme();
  const { data, error, mutate } = useVehicleReadiness(vehicleId);
  return (
    <Card style={{ gap: t.space.md }} aria-label="Emissions readiness">
      <Heading level={2}>Emissions readiness</Heading>
      <Loaded data={data} error={error} retry={() => void mutate()}>
        {({ snapshots }) =>
          snapshots.length === 0 ? (
            <Text tone="slate">No monitor status saved on this vehicle’s cases yet. Add one from a case.</Text>
          ) : (
            <SnapshotList snapshots={snapshots} withCase />
          )
        }
      </Loaded>
    </Card>
  );
}
