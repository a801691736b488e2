// The verdict, the monitor list and what to do next, for one readiness answer.
import { View } from 'react-native';
import { readinessView, type Tone } from '../../shared/readiness/view';
import type { ReadinessView as ReadinessAnswer } from '../../shared/schemas/readiness';
import type { ColourName } from '../theme/tokens';
import { useTheme } from '../theme/use-theme';
import { Badge, Caution } from '../ui/badges';
import type { IconName } from '../ui/icon';
import { Row } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';

const toneColour: Record<Tone, ColourName> = { ok: 'moss', warn: 'amber', bad: 'brick', muted: 'slate' };
const toneSymbol: Record<Tone, IconName> = { ok: 'check', warn: 'waiting', bad: 'alert', muted: 'unsupported' };

function MonitorList({ view }: { view: ReturnType<typeof readinessView> }) {
  const t = useTheme();
  return (
    <View style={{ gap: t.space.sm }}>
      {view.groups.map((g) => (
        <View key={g.title} role="list" aria-label={g.title} style={{ gap: t.space.xs }}>
          <Text variant="small" weight="semibold" tone="slate">
            {g.title}
          </Text>
          {g.rows.map((r) => (
            <View key={r.key} role="listitem" style={{ flexDirection: 'row', justifyContent: 'space-between', alignItems: 'center', gap: t.space.sm, borderTopWidth: 1, borderColor: t.colour.line, paddingTop: t.space.xs }}>
              <Text style={{ flex: 1 }}>{r.name}</Text>
              <Badge label={r.stateLabel} symbol={toneSymbol[r.tone]} tone={toneColour[r.tone]} />
            </View>
          ))}
        </View>
      ))}
      {view.notSupported.length ? (
        <Text variant="small" tone="slate">
          Not supported or not listed: {view.notSupported.join(', ')}.
        </Text>
      ) : null}
    </View>
  );
}

function NextSteps({ steps }: { steps: ReadinessAnswer['nextSteps'] }) {
  const t = useTheme();
  if (steps.length === 0) return null;
  return (
    <View style={{ gap: t.space.md }}>
      <Heading level={3}>To finish the incomplete monitors</Heading>
      {steps.map((s) => (
        <View key={s.monitor} style={{ gap: t.space.xs }}>
          <Text weight="semibold">{s.name}</Text>
          {s.conditions.map((c) => (
            <Text key={c} variant="small">
              • {c}
            </Text>
          ))}
        </View>
      ))}
      {/* every step carries the road-test caution; monitor-specific ones are shown once each */}
      {[...new Set(steps.map((s) => s.caution))].map((c) => (
        <Caution key={c}>{c}</Caution>
      ))}
    </View>
  );
}

export function ReadinessCard({ answer, showSteps = true }: { answer: ReadinessAnswer; showSteps?: boolean }) {
  const t = useTheme();
  const v = readinessView(answer);
  return (
    <View style={{ gap: t.space.md }}>
      <View style={{ gap: t.space.xs }}>
        <Badge label={v.headline} symbol={toneSymbol[v.tone]} tone={toneColour[v.tone]} />
        <Row wrap>
          <Badge label={v.milLabel} symbol={toneSymbol[v.milTone]} tone={toneColour[v.milTone]} />
          {v.codesLabel ? <Text variant="small" tone="slate">{v.codesLabel}</Text> : null}
          <Text variant="small" tone="slate">
            {v.ignitionLabel}
            {answer.verdict.modelYear ? ` · model year ${answer.verdict.modelYear}` : ' · model year not known'}
          </Text>
        </Row>
      </View>
      <View style={{ gap: t.space.xs }}>
        {answer.verdict.reasons.map((r) => (
          <Text key={r} variant="small">
            {r}
          </Text>
        ))}
      </View>
      <View style={{ gap: t.space.xxs, padding: t.space.sm, borderRadius: t.radius.sm, backgroundColor: t.colour.sand }}>
        <Text variant="small">
          <Text variant="small" weight="semibold">
            {v.ruleName}.{' '}
          </Text>
          {v.ruleLine}
        </Text>
        <Text variant="caption">{answer.verdict.rule.source}</Text>
        <Text variant="caption">{answer.verdict.note}</Text>
      </View>
      <MonitorList view={v} />
      {showSteps ? <NextSteps steps={answer.nextSteps} /> : null}
    </View>
  );
}
