// The cause picker: links a case to the tree cause it confirms, so the walk learns from it.
// Suggestions from the write-up come first; every cause of the shop's trees is a search away,
// grouped by tree and system.
import { useEffect, useState } from 'react';
import { Pressable, View } from 'react-native';
import type { CauseOption, CauseSuggestionView } from '../../shared/schemas/cases';
import type { System } from '../../shared/walk/tree-schema';
import { useTheme } from '../theme/use-theme';
import { Button } from '../ui/button';
import { Icon } from '../ui/icon';
import { Row } from '../ui/surfaces';
import { Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { SYSTEM_LABELS } from '../walks/labels';
import { suggestCauses, useShopCauses, type SuggestBody } from './api';

const systemLabel = (system: string) => SYSTEM_LABELS[system as System] ?? system;

/** One cause to pick: title, then tree, system and (for a suggestion) how well it matches. */
export function CauseRow({ option, selected, score, onPress }: { option: CauseOption; selected: boolean; score?: number; onPress: () => void }) {
  const t = useTheme();
  return (
    <Pressable
      role="radio"
      aria-checked={selected}
      accessibilityLabel={`${option.title} (${option.treeTitle})`}
      onPress={onPress}
      style={{
        minHeight: t.layout.touchTarget,
        justifyContent: 'center',
        paddingVertical: t.space.xs,
        paddingHorizontal: t.space.md,
        borderRadius: t.radius.md,
        borderWidth: 1.5,
        borderColor: selected ? t.colour.tide : t.colour.line,
        backgroundColor: selected ? t.colour.sand : t.colour.card,
      }}
    >
      <Row style={{ gap: t.space.xs }}>
        {selected ? <Icon name="check" size={14} tone="tide" /> : null}
        <Text weight={selected ? 'semibold' : 'regular'} style={{ flexShrink: 1 }}>
          {option.title}
        </Text>
      </Row>
      <Text variant="caption" tone="slate">
        {option.treeTitle} · {systemLabel(option.system)}
        {score !== undefined ? ` · ${Math.round(score * 100)} % match` : ''}
      </Text>
    </Pressable>
  );
}

/** Suggestions for what is typed now (debounced), so a new case gets them before its first save. */
export function useCauseSuggestions(body: SuggestBody): CauseSuggestionView[] {
  const [suggestions, setSuggestions] = useState<CauseSuggestionView[]>([]);
  const key = JSON.stringify(body);
  useEffect(() => {
    const parsed = JSON.parse(key) as SuggestBody;
    if (!parsed.rootCause.trim() && !parsed.fix.trim() && parsed.codes.length === 0) return setSuggestions([]);
    const timer = setTimeout(() => {
      suggestCauses(parsed)
        .then((r) => setSuggestions(r.suggestions))
        .catch(() => undefined); // suggestions help; the full list below still works without them
    }, 800);
    return () => clearTimeout(timer);
  }, [key]);
  return suggestions;
}

function matches(option: CauseOption, words: string[]): boolean {
  const hay = `${option.title} ${option.treeTitle} ${systemLabel(option.system)} ${option.cause}`.toLowerCase();
  return words.every((w) => hay.includes(w));
}

/** Causes grouped by tree, then by system, in the trees' own order. */
function groups(options: CauseOption[]): { tree: string; systems: { system: string; causes: CauseOption[] }[] }[] {
  const out: { tree: string; systems: { system: string; causes: CauseOption[] }[] }[] = [];
  for (const o of options) {
    let tree = out.find((g) => g.tree === o.treeTitle);
    if (!tree) out.push((tree = { tree: o.treeTitle, systems: [] }));
    let sys = tree.systems.find((s) => s.system === o.system);
    if (!sys) tree.systems.push((sys = { system: o.system, causes: [] }));
    sys.causes.push(o);
  }
  return out;
}

export function CausePicker({ value, onChange, suggestions }: { value: string | null; onChange: (cause: string | null) => void; suggestions: CauseSuggestionView[] }) {
  const t = useTheme();
  const all = useShopCauses();
  const [query, setQuery] = useState('');
  const [browsing, setBrowsing] = useState(false);
  const options = all.data?.causes ?? [];
  const current = options.find((o) => o.cause === value) ?? suggestions.find((s) => s.cause === value);
  const words = query.toLowerCase().split(/\s+/).filter(Boolean);
  const listed = words.length ? options.filter((o) => matches(o, words)) : browsing ? options : [];
  return (
    <View style={{ gap: t.space.sm }} aria-label="Cause in the trees">
      <Text variant="small" weight="semibold">
        Cause in the trees
      </Text>
      <Text variant="small" tone="slate">
        Link the cause you confirmed, and the next walk on a similar car puts it higher.
      </Text>
      {value ? (
        <Row wrap style={{ alignItems: 'center' }}>
          <Text weight="semibold" style={{ flexShrink: 1 }}>
            Linked: {current ? `${current.title} (${current.treeTitle})` : value}
          </Text>
          <Button kind="quiet" compact label="Clear" onPress={() => onChange(null)} />
        </Row>
      ) : (
        <Text variant="small">No cause linked yet.</Text>
      )}
      {suggestions.length ? (
        <View role="radiogroup" aria-label="Suggested causes" style={{ gap: t.space.xs }}>
          <Text variant="small" tone="slate">
            Suggested from the root cause, fix, codes and symptoms:
          </Text>
          {suggestions.slice(0, 3).map((s) => (
            <CauseRow key={s.cause} option={s} score={s.score} selected={s.cause === value} onPress={() => onChange(s.cause)} />
          ))}
        </View>
      ) : null}
      <TextField label="Search the causes" placeholder="e.g. coil connector, charge pipe" value={query} onChangeText={setQuery} autoCapitalize="none" />
      {!words.length ? <Button kind="quiet" compact label={browsing ? 'Hide the full list' : `Browse all ${options.length} causes`} onPress={() => setBrowsing(!browsing)} /> : null}
      {words.length && listed.length === 0 ? <Text variant="small" tone="slate">No cause matches “{query}”.</Text> : null}
      {groups(listed).map((g) => (
        <View key={g.tree} style={{ gap: t.space.xs }}>
          <Text weight="semibold">{g.tree}</Text>
          {g.systems.map((s) => (
            <View key={s.system} role="radiogroup" aria-label={`${g.tree}: ${systemLabel(s.system)}`} style={{ gap: t.space.xs, paddingLeft: t.space.sm, borderLeftWidth: 2, borderColor: t.colour.line }}>
              <Text variant="small" tone="slate">
                {systemLabel(s.system)}
              </Text>
              {s.causes.map((o) => (
                <CauseRow key={o.cause} option={o} selected={o.cause === value} onPress={() => onChange(o.cause)} />
              ))}
            </View>
          ))}
        </View>
      ))}
    </View>
  );
}
