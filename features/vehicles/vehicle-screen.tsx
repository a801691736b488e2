// One vehicle: its visits in order with codes, status, confirmed fix and comeback links.
import { Link, useLocalSearchParams, type Href } from 'expo-router';
import { View } from 'react-native';
import type { VehicleVisit } from '../../shared/schemas/patterns';
import { useTheme } from '../theme/use-theme';
import { Badge, CodeChip } from '../ui/badges';
import { EmptyState, Loaded } from '../ui/states';
import { Card, Row, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { longDay, plural } from '../patterns/format';
import { useVehicle } from './api';
import { vehicleName } from './vehicles-screen';
import { BackLink } from '../ui/back-link';
import { VehicleReadinessPanel } from '../readiness/vehicle-readiness-panel';

const statusWords = { draft: 'Draft', review: 'In review', published: 'Published' } as const;

function CaseLink({ id, children }: { id: number; children: string }) {
  return (
    <Link href={`/cases/${id}` as Href}>
      <Text tone="tide" weight="semibold" style={{ textDecorationLine: 'underline' }}>
        {children}
      </Text>
    </Link>
  );
}

function Visit({ v, n, titles }: { v: VehicleVisit; n: number; titles: Map<number, string> }) {
  const t = useTheme();
  return (
    <Card style={{ gap: t.space.sm, borderLeftWidth: v.comebackOf ? 4 : 1, borderLeftColor: v.comebackOf ? t.colour.brick : t.colour.line }}>
      <Text variant="small" tone="slate">
        Visit {n} · {longDay(v.day)}
        {v.mileage !== null ? ` · ${v.mileage.toLocaleString('en-GB')} ${v.mileageUnit ?? 'km'}` : ''}
      </Text>
      <CaseLink id={v.caseId}>{v.title}</CaseLink>
      <Row wrap>
        {v.codes.map((c) => (
          <CodeChip key={c} code={c} />
        ))}
        <Badge label={statusWords[v.status]} />
        {v.confirmed ? <Badge label="Fix confirmed" symbol="check" tone="moss" /> : <Badge label="Not confirmed" symbol="open" tone="slate" />}
        {v.comebackOf ? <Badge label="Comeback" symbol="comeback" tone="brick" /> : null}
      </Row>
      {v.comebackOf ? (
        <Text variant="small">
          Came back {plural(v.comebackOf.days, 'day')} after <CaseLink id={v.comebackOf.caseId}>{titles.get(v.comebackOf.caseId) ?? `case ${v.comebackOf.caseId}`}</CaseLink> ({v.comebackOf.reason}).
        </Text>
      ) : null}
      {v.cameBackAs.map((c) => (
        <Text key={c.caseId} variant="small">
          This fix did not hold: back {plural(c.days, 'day')} later as <CaseLink id={c.caseId}>{titles.get(c.caseId) ?? `case ${c.caseId}`}</CaseLink> ({c.reason}).
        </Text>
      ))}
    </Card>
  );
}

export function VehicleScreen() {
  const t = useTheme();
  const { id } = useLocalSearchParams<{ id: string }>();
  const numeric = /^\d+$/.test(id ?? '') ? Number(id) : null;
  const { data, error, mutate } = useVehicle(numeric);
  return (
    <Screen width="reading">
      <BackLink href={'/vehicles' as Href} label="All vehicles" />
      {numeric === null ? (
        <EmptyState title="No vehicle here" hint="That address does not name a vehicle." />
      ) : (
        <Loaded data={data} error={error} retry={() => void mutate()}>
          {({ vehicle, visits, window }) => {
            const titles = new Map(visits.map((v) => [v.caseId, v.title]));
            return (
              <View style={{ gap: t.space.lg }}>
                <View style={{ gap: t.space.xs }}>
                  <Heading>{vehicleName(vehicle)}</Heading>
                  <Text mono tone="slate">
                    VIN {vehicle.vin}
                  </Text>
                  <Text>
                    {vehicle.platform?.label ?? 'Platform not set'}
                    {vehicle.fleetNumber ? ` · fleet ${vehicle.fleetNumber}` : ''} · {plural(vehicle.visits, 'visit')}
                    {vehicle.comebacks ? ` · ${plural(vehicle.comebacks, 'comeback')}` : ''}
                  </Text>
                  <Text variant="small" tone="slate">
                    A comeback is a return with the same code or system within {window.days} days and {window.km.toLocaleString('en-GB')} km of a confirmed fix.
                  </Text>
                </View>
                <VehicleReadinessPanel vehicleId={vehicle.id} />
                {visits.length === 0 ? (
                  <EmptyState title="No visits you can see" hint="Cases for this vehicle are drafts of someone else." />
                ) : (
                  visits.map((v, i) => <Visit key={v.caseId} v={v} n={i + 1} titles={titles} />)
                )}
              </View>
            );
          }}
        </Loaded>
      )}
    </Screen>
  );
}
