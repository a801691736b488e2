// The shop's vehicles: most recent visit first, with visit and comeback counts.
import { Link, type Href } from 'expo-router';
import { View } from 'react-native';
import type { VehicleSummary } from '../../shared/schemas/patterns';
import { useTheme } from '../theme/use-theme';
import { Badge } from '../ui/badges';
import { EmptyState, Loaded } from '../ui/states';
import { Card, Row, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { useVehicles } from './api';
import { longDay, plural } from '../patterns/format';

export const vehicleName = (v: Pick<VehicleSummary, 'plate' | 'fleetNumber' | 'vin'>) => v.plate ?? (v.fleetNumber ? `Fleet ${v.fleetNumber}` : v.vin);

function VehicleRow({ v }: { v: VehicleSummary }) {
  const t = useTheme();
  return (
    <Link href={`/vehicles/${v.id}` as Href} accessibilityLabel={`${vehicleName(v)}, ${plural(v.visits, 'visit')}`}>
      <Card style={{ gap: t.space.xs, width: '100%' }}>
        <Row wrap style={{ justifyContent: 'space-between' }}>
          <Text weight="semibold" variant="lead">
            {vehicleName(v)}
          </Text>
          {v.comebacks > 0 ? <Badge label={plural(v.comebacks, 'comeback')} symbol="comeback" tone="brick" /> : null}
        </Row>
        <Text mono variant="small" tone="slate">
          {v.vin}
        </Text>
        <Text variant="small">
          {v.platform?.label ?? 'Platform not set'} · {plural(v.visits, 'visit')}
          {v.lastVisit ? `, last ${longDay(v.lastVisit)}` : ''}
        </Text>
      </Card>
    </Link>
  );
}

export function VehiclesScreen() {
  const t = useTheme();
  const { data, error, mutate } = useVehicles();
  return (
    <Screen>
      <Heading>Vehicles</Heading>
      <Text tone="slate">Every vehicle the shop has written a case for, by VIN. Open one to see its visits in order and any comebacks.</Text>
      <Loaded data={data} error={error} retry={() => void mutate()}>
        {({ vehicles }) =>
          vehicles.length === 0 ? (
            <EmptyState title="No vehicles yet" hint="A vehicle appears here when a case names its VIN." />
          ) : (
            <View style={{ gap: t.space.md }}>
              {vehicles.map((v) => (
                <VehicleRow key={v.id} v={v} />
              ))}
            </View>
          )
        }
      </Loaded>
    </Screen>
  );
}
