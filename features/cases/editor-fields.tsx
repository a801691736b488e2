// Structured fields of the editor: code chips checked with parseDtc, symptom tags with the shop's
// suggestions, the platform picker and the VIN check shown as you type.
import { useState } from 'react';
import { Pressable, View } from 'react-native';
import { parseDtc } from '../../shared/codes';
import { tagSchema } from '../../shared/schemas/cases';
import { checkVin, type VinCheck } from '../../shared/vin';
import { useTheme } from '../theme/use-theme';
import { CodeChip } from '../ui/badges';
import { Button } from '../ui/button';
import { Choice } from '../ui/choice';
import { Row } from '../ui/surfaces';
import { Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { usePlatforms, useTags } from './api';
import { platformName } from './labels';
import { Icon, type IconName } from '../ui/icon';

function Pill({ label, onPress, a11y }: { label: string; onPress: () => void; a11y: string }) {
  const t = useTheme();
  return (
    <Pressable role="button" accessibilityLabel={a11y} onPress={onPress} style={{ minHeight: t.layout.touchTarget, justifyContent: 'center', paddingHorizontal: t.space.md, borderRadius: t.radius.pill, borderWidth: 1.5, borderStyle: 'dashed', borderColor: t.colour.tide }}>
      <Text tone="tide" weight="semibold" variant="small">
        {label}
      </Text>
    </Pressable>
  );
}

/** Type a code and press Enter or Add; a malformed one stays in the box with the reason beside it. */
export function CodeChips({ codes, suggested, onChange, error }: { codes: string[]; suggested: string[]; onChange: (codes: string[]) => void; error?: string }) {
  const t = useTheme();
  const [text, setText] = useState('');
  const [reason, setReason] = useState<string | undefined>();
  const add = (input: string) => {
    const parsed = parseDtc(input);
    if (!parsed.ok) return setReason(`“${input.trim()}” is not a trouble code: ${parsed.reason}.`);
    setReason(undefined);
    setText('');
    if (!codes.includes(parsed.dtc.full)) onChange([...codes, parsed.dtc.full]);
  };
  const offers = suggested.filter((c) => !codes.includes(c));
  return (
    <View style={{ gap: t.space.sm }}>
      <Row style={{ alignItems: 'flex-start' }}>
        <View style={{ flex: 1 }}>
          <TextField label="Trouble codes" mono autoCapitalize="characters" placeholder="P0302" value={text} onChangeText={setText} onSubmitEditing={() => add(text)} error={reason ?? error} hint="SAE J2012, e.g. P0302 or P0302-13" />
        </View>
        <View style={{ paddingTop: 24 }}>
          <Button kind="secondary" compact label="Add" onPress={() => add(text)} />
        </View>
      </Row>
      {codes.length ? (
        <Row wrap style={{ gap: t.space.xs }} aria-label="Codes on this case">
          {codes.map((c) => (
            <CodeChip key={c} code={c} onRemove={() => onChange(codes.filter((x) => x !== c))} />
          ))}
        </Row>
      ) : null}
      {offers.length ? (
        <View style={{ gap: t.space.xs }}>
          <Text variant="small" tone="slate">
            Found in the note — tap to add:
          </Text>
          <Row wrap style={{ gap: t.space.xs }}>
            {offers.map((c) => (
              <Pill key={c} label={`+ ${c}`} a11y={`Add ${c}`} onPress={() => add(c)} />
            ))}
          </Row>
        </View>
      ) : null}
    </View>
  );
}

export function SymptomTags({ tags, onChange, error }: { tags: string[]; onChange: (tags: string[]) => void; error?: string }) {
  const t = useTheme();
  const shopTags = useTags();
  const [text, setText] = useState('');
  const [reason, setReason] = useState<string | undefined>();
  const add = (input: string) => {
    const parsed = tagSchema.safeParse(input);
    if (!parsed.success) return setReason(parsed.error.issues[0]?.message);
    setReason(undefined);
    setText('');
    if (!tags.includes(parsed.data)) onChange([...tags, parsed.data]);
  };
  const typed = text.trim().toLowerCase().replace(/\s+/g, '-');
  const suggestions = (shopTags.data?.tags ?? [])
    .filter((s) => !tags.includes(s.tag) && (typed ? s.tag.includes(typed) : true))
    .sort((a, b) => b.count - a.count)
    .slice(0, 6);
  return (
    <View style={{ gap: t.space.sm }}>
      <Row style={{ alignItems: 'flex-start' }}>
        <View style={{ flex: 1 }}>
          <TextField label="Symptoms" placeholder="rough idle" autoCapitalize="none" value={text} onChangeText={setText} onSubmitEditing={() => add(text)} error={reason ?? error} hint="What the driver or you noticed; Enter adds it" />
        </View>
        <View style={{ paddingTop: 24 }}>
          <Button kind="secondary" compact label="Add" onPress={() => add(text)} />
        </View>
      </Row>
      {tags.length ? (
        <Row wrap style={{ gap: t.space.xs }} aria-label="Symptoms on this case">
          {tags.map((tag) => (
            <View key={tag} style={{ flexDirection: 'row', alignItems: 'center', gap: t.space.xs, backgroundColor: t.colour.sand, borderRadius: t.radius.pill, paddingLeft: t.space.md }}>
              <Text variant="small">{tag}</Text>
              <Pressable role="button" accessibilityLabel={`Remove ${tag}`} onPress={() => onChange(tags.filter((x) => x !== tag))} style={{ minWidth: 36, minHeight: 36, alignItems: 'center', justifyContent: 'center' }}>
                <Icon name="close" size={14} tone="slate" />
              </Pressable>
            </View>
          ))}
        </Row>
      ) : null}
      {suggestions.length ? (
        <Row wrap style={{ gap: t.space.xs }}>
          {suggestions.map((s) => (
            <Pill key={s.tag} label={`+ ${s.tag} (${s.count})`} a11y={`Add symptom ${s.tag}`} onPress={() => add(s.tag)} />
          ))}
        </Row>
      ) : null}
    </View>
  );
}

export function PlatformPicker({ value, onChange }: { value: number | null; onChange: (id: number | null) => void }) {
  const t = useTheme();
  const { data, error, mutate } = usePlatforms();
  if (error)
    return (
      <View style={{ gap: t.space.xs }}>
        <Text variant="small" weight="semibold">Platform</Text>
        <Text tone="brick" variant="small">The platform list did not load.</Text>
        <Button kind="quiet" compact label="Try again" onPress={() => void mutate()} />
      </View>
    );
  if (!data) return <Text tone="slate" variant="small">Loading platforms…</Text>;
  const options = [{ value: '', label: 'None' }, ...data.platforms.map((p) => ({ value: String(p.id), label: platformName(p) }))];
  return <Choice label="Platform" options={options} value={value === null ? '' : String(value)} onChange={(v) => onChange(v ? Number(v) : null)} />;
}

function StatusLine({ icon, tone, text }: { icon: IconName; tone: 'brick' | 'amber' | 'moss'; text: string }) {
  return (
    <Row role="status" style={{ gap: 4 }}>
      <Icon name={icon} size={14} tone={tone} />
      <Text variant="small" tone={tone} style={{ flexShrink: 1 }}>
        {text}
      </Text>
    </Row>
  );
}

/** One line for a VIN check: the first refusal, else the first North American warning, else a tick with the years. */
function VinCheckLine({ check }: { check: VinCheck }) {
  if (!check.valid) return <StatusLine icon="close" tone="brick" text={check.errors[0] ?? 'Not a VIN.'} />;
  if (check.warnings.length) return <StatusLine icon="alert" tone="amber" text={check.warnings[0]!} />;
  const years = check.modelYears.length ? ` · model year ${check.modelYears.join(' or ')}` : '';
  return <StatusLine icon="check" tone="moss" text={`Valid VIN (check digit ${check.checkDigit})${years}`} />;
}

/** The VIN check as you type: a tick with the model-year candidates, a warning, or the first problem found. */
export function VinField({ value, onChange, error }: { value: string; onChange: (v: string) => void; error?: string }) {
  const t = useTheme();
  const check = value.trim() ? checkVin(value) : null;
  return (
    <View style={{ gap: t.space.xs }}>
      <TextField label="VIN" mono autoCapitalize="characters" autoCorrect={false} maxLength={20} value={value} onChangeText={onChange} error={error} />
      {check ? <VinCheckLine check={check} /> : <Text variant="small" tone="slate">17 characters; checked as you type</Text>}
    </View>
  );
}
