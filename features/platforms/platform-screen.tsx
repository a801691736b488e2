// One platform: banks and firing order in plain words, a cylinder checker, and editing for seniors.
import { useLocalSearchParams, type Href } from 'expo-router';
import { useState } from 'react';
import { View } from 'react-native';
import { describeCylinders } from '../../shared/platform';
import { allows } from '../../shared/policy';
import type { PlatformDetailResponse } from '../../shared/schemas/platforms';
import { ApiError } from '../api/client';
import { useSession } from '../auth/use-session';
import { useBreakpoint, useTheme } from '../theme/use-theme';
import { Badge, CodeChip } from '../ui/badges';
import { Button } from '../ui/button';
import { Notice } from '../ui/notice';
import { EmptyState, Loaded } from '../ui/states';
import { Card, Row, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { patchPlatform, usePlatform } from './api';
import { fuelLabels, inductionLabels, layoutLabels, platformSummary, platformTitle } from './labels';
import { PlatformForm } from './platform-form';
import { BackLink } from '../ui/back-link';

function Facts({ data }: { data: PlatformDetailResponse }) {
  const t = useTheme();
  const { platform: p, facts } = data;
  return (
    <Card>
      <Heading level={2}>Banks and firing order</Heading>
      <Row wrap>
        <Badge label={p.cylinders === 0 ? 'No cylinders' : `${layoutLabels[p.layout]} ${p.cylinders}`} />
        {p.fuel ? <Badge label={fuelLabels[p.fuel]} /> : null}
        {p.induction ? <Badge label={inductionLabels[p.induction]} /> : null}
      </Row>
      {facts.bankWords.map((w) => (
        <Text key={w}>{w}</Text>
      ))}
      {p.firingOrder ? (
        <View style={{ gap: t.space.xs }}>
          <Text>
            Firing order <Text mono weight="semibold">{p.firingOrder.join('-')}</Text>
          </Text>
          {facts.companionPairs.length ? (
            <>
              <Text variant="small" tone="slate">
                Firing companions are at top dead centre together, one on compression and one on the exhaust stroke:
              </Text>
              {facts.companionWords.map((w) => (
                <Text key={w}>• {w.charAt(0).toUpperCase() + w.slice(1)}</Text>
              ))}
            </>
          ) : (
            <Text variant="small" tone="slate">
              An odd number of cylinders has no firing companions.
            </Text>
          )}
        </View>
      ) : (
        <Text tone="slate">Firing order not recorded.</Text>
      )}
    </Card>
  );
}

/** Type the cylinders that misfire; the platform says which bank and whether they are companions. */
function CylinderCheck({ data }: { data: PlatformDetailResponse }) {
  const [input, setInput] = useState('');
  const cylinders = input
    .split(/[^0-9]+/)
    .filter(Boolean)
    .map(Number);
  const p = data.platform;
  if (p.cylinders === 0) return null;
  return (
    <Card>
      <Heading level={3}>Which cylinders are affected?</Heading>
      <TextField label="Cylinders" value={input} onChangeText={setInput} placeholder="2 and 5" inputMode="numeric" hint="Misfires on both banks point to shared causes (fuel, air, timing); on one bank, to that bank." />
      {cylinders.length ? (
        <Row wrap>
          {cylinders.slice(0, 12).map((c, i) => (c >= 1 && c <= 12 ? <CodeChip key={`${c}-${i}`} code={`P03${String(c).padStart(2, '0')}`} /> : null))}
          <Text style={{ flexBasis: '100%' }} aria-live="polite">
            {describeCylinders(p, cylinders)}
          </Text>
        </Row>
      ) : null}
    </Card>
  );
}

export function PlatformScreen() {
  const t = useTheme();
  const { isWide } = useBreakpoint();
  const { id } = useLocalSearchParams<{ id: string }>();
  const { user } = useSession();
  const { data, error, mutate } = usePlatform(typeof id === 'string' ? id : null);
  const [editing, setEditing] = useState(false);
  const [saved, setSaved] = useState(false);
  const canManage = user ? allows(user, 'platforms.manage') : false;
  const missing = error instanceof ApiError && (error.status === 404 || error.status === 400);
  return (
    <Screen>
      <BackLink href={'/platforms' as Href} label="All platforms" />
      {missing ? (
        <EmptyState title="No such platform" hint="It may have been removed, or the link belongs to another shop." />
      ) : (
        <Loaded data={data} error={error} retry={() => void mutate()} lines={4}>
          {(d) => (
            <>
              <Row wrap style={{ justifyContent: 'space-between' }}>
                <View style={{ gap: 2, flexShrink: 1 }}>
                  <Heading>{platformTitle(d.platform)}</Heading>
                  <Text mono>{platformSummary(d.platform)}</Text>
                </View>
                {canManage && !editing ? <Button label="Edit" kind="secondary" compact onPress={() => setEditing(true)} /> : null}
              </Row>
              {saved ? <Notice tone="success">Saved.</Notice> : null}
              {editing ? (
                <PlatformForm
                  platform={d.platform}
                  onCancel={() => setEditing(false)}
                  save={async (rec) => {
                    const r = rec as Record<string, unknown>;
                    const patch = { ...r, banks: r.banks ?? null, firingOrder: r.firingOrder ?? null, fuel: r.fuel ?? null, induction: r.induction ?? null };
                    const res = await patchPlatform(d.platform.id, patch as never);
                    await mutate(res, { revalidate: false });
                    return res.platform.id;
                  }}
                  onSaved={() => {
                    setEditing(false);
                    setSaved(true);
                  }}
                />
              ) : isWide ? (
                <View style={{ flexDirection: 'row', gap: t.space.xl, alignItems: 'flex-start' }}>
                  <View style={{ flex: 1 }}>
                    <Facts data={d} />
                  </View>
                  <View style={{ flex: 1 }}>
                    <CylinderCheck data={d} />
                  </View>
                </View>
              ) : (
                <>
                  <Facts data={d} />
                  <CylinderCheck data={d} />
                </>
              )}
            </>
          )}
        </Loaded>
      )}
    </Screen>
  );
}
