// Add or edit a platform. Checked with the same shared schema the server uses, messages beside the fields.
import { useState } from 'react';
import { View } from 'react-native';
import { bankFiringWarnings, fuels, inductions, platformLayouts } from '../../shared/platform';
import { platformCreateSchema, type PlatformView } from '../../shared/schemas/platforms';
import { ApiError } from '../api/client';
import { fieldsFromIssues } from './form-errors';
import { useBreakpoint, useTheme } from '../theme/use-theme';
import { Button } from '../ui/button';
import { Choice } from '../ui/choice';
import { Notice } from '../ui/notice';
import { Card } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { fuelLabels, inductionLabels, layoutLabels } from './labels';

type Layout = (typeof platformLayouts)[number];
type FuelChoice = (typeof fuels)[number] | '';
type InductionChoice = (typeof inductions)[number] | '';

interface Draft {
  make: string;
  model: string;
  engine: string;
  yearFrom: string;
  yearTo: string;
  cylinders: string;
  bank1: string;
  bank2: string;
  firingOrder: string;
}

const list = (s: string) =>
  s
    .split(/[\s,;\-–]+/)
    .filter(Boolean)
    .map((n) => Number(n));
const num = (s: string) => (s.trim() === '' ? undefined : Number(s.trim()));

function draftOf(p?: PlatformView): Draft {
  return {
    make: p?.make ?? '',
    model: p?.model ?? '',
    engine: p?.engine ?? '',
    yearFrom: p ? String(p.yearFrom) : '',
    yearTo: p ? String(p.yearTo) : '',
    cylinders: p ? String(p.cylinders) : '',
    bank1: p?.banks?.['1'].join(', ') ?? '',
    bank2: p?.banks?.['2'].join(', ') ?? '',
    firingOrder: p?.firingOrder?.join('-') ?? '',
  };
}

export function PlatformForm({ platform, onSaved, onCancel, save }: { platform?: PlatformView; onSaved: (id: number) => void; onCancel?: () => void; save: (record: unknown) => Promise<number> }) {
  const t = useTheme();
  const { isTablet } = useBreakpoint();
  const [d, setD] = useState<Draft>(draftOf(platform));
  const [layout, setLayout] = useState<Layout>(platform?.layout ?? 'inline');
  const [fuel, setFuel] = useState<FuelChoice>(platform?.fuel ?? '');
  const [induction, setInduction] = useState<InductionChoice>(platform?.induction ?? '');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const set = (k: keyof Draft) => (v: string) => setD((x) => ({ ...x, [k]: v }));

  const record = () => ({
    make: d.make,
    model: d.model,
    engine: d.engine,
    yearFrom: num(d.yearFrom),
    yearTo: num(d.yearTo),
    cylinders: num(d.cylinders),
    layout,
    ...(layout !== 'inline' && (d.bank1.trim() || d.bank2.trim()) ? { banks: { '1': list(d.bank1), '2': list(d.bank2) } } : {}),
    ...(d.firingOrder.trim() ? { firingOrder: list(d.firingOrder) } : {}),
    ...(fuel ? { fuel } : {}),
    ...(induction ? { induction } : {}),
  });

  // A bank map that does not fit the firing order is a warning here, not an error: the tech may know better.
  const draft = platformCreateSchema.safeParse(record());
  const firingWarnings = draft.success ? bankFiringWarnings(draft.data) : [];

  const submit = async () => {
    const parsed = platformCreateSchema.safeParse(record());
    if (!parsed.success) {
      setErrors(fieldsFromIssues(parsed.error.issues));
      setFormError('Check the fields marked below.');
      return;
    }
    setErrors({});
    setFormError(null);
    setBusy(true);
    try {
      onSaved(await save(parsed.data));
    } catch (err) {
      if (err instanceof ApiError) {
        setErrors(err.fields);
        setFormError(err.message);
      } else setFormError('Could not save. Try again.');
    } finally {
      setBusy(false);
    }
  };

  const pair = (a: React.ReactNode, b: React.ReactNode) => (
    <View style={{ flexDirection: isTablet ? 'row' : 'column', gap: t.space.md }}>
      <View style={{ flex: 1 }}>{a}</View>
      <View style={{ flex: 1 }}>{b}</View>
    </View>
  );

  return (
    <Card>
      <Heading level={2}>{platform ? 'Edit platform' : 'Add a platform'}</Heading>
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      {pair(
        <TextField label="Make" value={d.make} onChangeText={set('make')} error={errors.make} />,
        <TextField label="Model" value={d.model} onChangeText={set('model')} error={errors.model} />,
      )}
      <TextField label="Engine code" value={d.engine} onChangeText={set('engine')} error={errors.engine} autoCapitalize="characters" />
      {pair(
        <TextField label="First year" value={d.yearFrom} onChangeText={set('yearFrom')} error={errors.yearFrom} inputMode="numeric" />,
        <TextField label="Last year" value={d.yearTo} onChangeText={set('yearTo')} error={errors.yearTo} inputMode="numeric" />,
      )}
      <TextField label="Cylinders" value={d.cylinders} onChangeText={set('cylinders')} error={errors.cylinders} inputMode="numeric" hint="0 for an electric platform." />
      <Choice label="Layout" options={platformLayouts.map((v) => ({ value: v, label: layoutLabels[v] }))} value={layout} onChange={setLayout} />
      {errors.layout ? <Text variant="small" tone="brick" role="alert">{errors.layout}</Text> : null}
      {layout !== 'inline' ? (
        <View style={{ gap: t.space.sm }}>
          <Text tone="slate" variant="small">
            Makers number cylinders differently: write down which cylinders sit on each bank. Bank 1 is the bank with cylinder 1.
          </Text>
          {pair(
            <TextField label="Bank 1 cylinders" value={d.bank1} onChangeText={set('bank1')} placeholder="1, 3, 5" error={errors.banks} />,
            <TextField label="Bank 2 cylinders" value={d.bank2} onChangeText={set('bank2')} placeholder="2, 4, 6" />,
          )}
        </View>
      ) : null}
      <TextField label="Firing order" value={d.firingOrder} onChangeText={set('firingOrder')} placeholder="1-3-4-2" error={errors.firingOrder} hint="Cylinder numbers in the order they fire, e.g. 1-3-4-2." />
      {firingWarnings.map((w) => (
        <Notice key={w} tone="info">{`${w}. You can still save; the walk reads banks from this map.`}</Notice>
      ))}
      <Choice label="Fuel" options={[{ value: '' as FuelChoice, label: 'Not set' }, ...fuels.map((v) => ({ value: v as FuelChoice, label: fuelLabels[v] }))]} value={fuel} onChange={setFuel} />
      <Choice label="Induction" options={[{ value: '' as InductionChoice, label: 'Not set' }, ...inductions.map((v) => ({ value: v as InductionChoice, label: inductionLabels[v] }))]} value={induction} onChange={setInduction} />
      <View style={{ flexDirection: 'row', gap: t.space.sm, flexWrap: 'wrap' }}>
        <Button label={platform ? 'Save changes' : 'Add platform'} onPress={submit} busy={busy} />
        {onCancel ? <Button label="Cancel" kind="quiet" onPress={onCancel} /> : null}
      </View>
    </Card>
  );
}
