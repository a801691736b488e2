// Shop settings (manager): name, where the shop is (country, time zone) and the comeback
// window. Dates, "today" and the digest week follow the zone; rules that hold only in some
// regions are named here.
import { useEffect, useState } from 'react';
import { View } from 'react-native';
import type { ShopPatch, ShopSettings } from '../../shared/schemas/shop';
import { countryName, knownTimeZones } from '../../shared/shop-time';
import { ApiError } from '../api/client';
import { useSession } from '../auth/use-session';
import { useTheme } from '../theme/use-theme';
import { Button } from '../ui/button';
import { Notice } from '../ui/notice';
import { Loaded } from '../ui/states';
import { Card, Row, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { saveShop, useShop } from './api';

interface FormValues {
  name: string;
  country: string;
  timeZone: string;
  comebackDays: string;
  comebackKm: string;
}

const toForm = (s: ShopSettings): FormValues => ({
  name: s.name,
  country: s.country ?? '',
  timeZone: s.timeZone,
  comebackDays: String(s.comebackDays),
  comebackKm: String(s.comebackKm),
});

/** Numbers go as numbers (the server says why a bad one is refused); an empty country clears it. */
function toPatch(v: FormValues): ShopPatch {
  const number = (text: string) => (text.trim() === '' || Number.isNaN(Number(text)) ? (text as unknown as number) : Number(text));
  return { name: v.name, country: v.country.trim() ? v.country.trim().toUpperCase() : null, timeZone: v.timeZone.trim(), comebackDays: number(v.comebackDays), comebackKm: number(v.comebackKm) };
}

/** Up to six zone names containing what was typed ("lisb" -> Europe/Lisbon). */
function zoneSuggestions(typed: string): string[] {
  const needle = typed.trim().toLowerCase().replace(/\s+/g, '_');
  if (needle.length < 3) return [];
  const zones = knownTimeZones();
  if (zones.some((z) => z.toLowerCase() === needle)) return [];
  return zones.filter((z) => z.toLowerCase().includes(needle)).slice(0, 6);
}

function SettingsForm({ shop, onSaved }: { shop: ShopSettings; onSaved: (s: ShopSettings) => void }) {
  const t = useTheme();
  const [values, setValues] = useState(() => toForm(shop));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  useEffect(() => setValues(toForm(shop)), [shop]);
  const set = (key: keyof FormValues) => (text: string) => setValues((v) => ({ ...v, [key]: text }));
  const named = values.country.trim() ? countryName(values.country.trim().toUpperCase()) : null;

  const save = async () => {
    setBusy(true);
    setMessage(null);
    try {
      const { shop: saved } = await saveShop(toPatch(values));
      setErrors({});
      setMessage({ tone: 'success', text: 'Saved. Dates now show in the shop’s time zone.' });
      onSaved(saved);
    } catch (err) {
      setErrors(err instanceof ApiError ? err.fields : {});
      setMessage({ tone: 'error', text: err instanceof ApiError ? err.message : 'Could not save. Try again.' });
    } finally {
      setBusy(false);
    }
  };

  return (
    <Card style={{ gap: t.space.md }}>
      <TextField label="Shop name" value={values.name} onChangeText={set('name')} error={errors.name} maxLength={120} />
      <TextField
        label="Country (ISO 3166 code)"
        value={values.country}
        onChangeText={set('country')}
        error={errors.country}
        hint={named ?? (values.country.trim() ? 'Not a country code yet: two letters such as NZ, PT or CA.' : 'Two letters such as NZ, PT or CA. Leave empty if you would rather not say.')}
        autoCapitalize="characters"
        maxLength={2}
        mono
      />
      <View style={{ gap: t.space.xs }}>
        <TextField label="Time zone" value={values.timeZone} onChangeText={set('timeZone')} error={errors.timeZone} hint="A zone name such as Europe/Lisbon or Pacific/Auckland; type part of a city to pick it." autoCapitalize="none" autoCorrect={false} />
        <Row wrap>
          {zoneSuggestions(values.timeZone).map((z) => (
            <Button key={z} compact kind="secondary" label={z} onPress={() => set('timeZone')(z)} />
          ))}
        </Row>
      </View>
      <Row wrap style={{ alignItems: 'flex-start' }}>
        <View style={{ flexGrow: 1, minWidth: 140 }}>
          <TextField label="Comeback window, days" value={values.comebackDays} onChangeText={set('comebackDays')} error={errors.comebackDays} inputMode="numeric" />
        </View>
        <View style={{ flexGrow: 1, minWidth: 140 }}>
          <TextField label="Comeback window, km" value={values.comebackKm} onChangeText={set('comebackKm')} error={errors.comebackKm} inputMode="numeric" />
        </View>
      </Row>
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
      <Button label="Save settings" busy={busy} onPress={() => void save()} />
    </Card>
  );
}

export function ShopSettingsScreen() {
  const t = useTheme();
  const { refresh } = useSession();
  const { data, error, mutate } = useShop();
  return (
    <Screen width="reading">
      <Heading>Shop settings</Heading>
      <Text tone="slate">Where the shop is decides the day it is living in: “today”, the weekly digest and every date on screen follow its time zone.</Text>
      <Loaded data={data} error={error} retry={() => void mutate()}>
        {({ shop }) => (
          <View style={{ gap: t.space.md }}>
            <Text variant="small" tone="slate">
              Today in the shop: {shop.today} ({shop.timeZone}){shop.countryName ? ` · ${shop.countryName}` : ''}
            </Text>
            <SettingsForm
              shop={shop}
              onSaved={(saved) => {
                void mutate({ shop: saved }, { revalidate: false });
                refresh();
              }}
            />
            {shop.regionalNotes.length ? (
              <Card style={{ gap: t.space.sm }} accessibilityLabel="Rules that depend on the region">
                <Heading level={3}>Rules that depend on the region</Heading>
                {shop.regionalNotes.map((n) => (
                  <Notice key={n} tone="info">
                    {n}
                  </Notice>
                ))}
              </Card>
            ) : null}
          </View>
        )}
      </Loaded>
    </Screen>
  );
}
