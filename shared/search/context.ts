// Recent work on the car, read from phrases like "after timing work",
// "since the belt job", "after swap". Recent work is one of the strongest
// clues a tech has, so it becomes a tag of its own. Generic words (tune,
// battery, flash, swap) only count behind a trigger ("after", "since"); job
// phrases ("belt job", "clutch replacement") count anywhere.
// Expects sanitised text (single spaces).
import { consume } from './text';

export const CONTEXT_TAGS = [
  'after-timing-work',
  'after-belt-job',
  'after-engine-swap',
  'after-tune',
  'after-clutch-job',
  'after-brake-job',
  'after-battery-change',
  'after-programming',
  'after-accident-repair',
] as const;
export type ContextTag = (typeof CONTEXT_TAGS)[number];

export const CONTEXT_LABELS: Record<ContextTag, string> = {
  'after-timing-work': 'after timing work',
  'after-belt-job': 'after belt job',
  'after-engine-swap': 'after engine swap',
  'after-tune': 'after tune',
  'after-clutch-job': 'after clutch job',
  'after-brake-job': 'after brake job',
  'after-battery-change': 'after battery change',
  'after-programming': 'after programming',
  'after-accident-repair': 'after accident repair',
};

const B = String.raw`(?<![\p{L}\p{N}])`;
const E = String.raw`(?![\p{L}\p{N}])`;
const TRIGGER = String.raw`(?:(?:ever|right|just|straight|soon|shortly) )?(?:after|since|following|post)`;
// Words that may sit between the trigger and the job: "since we did the new belt".
const FILLER = String.raw`(?: (?:the|a|an|my|our|his|her|their|its|that|this|last|recent|recently|new|we|i|he|she|they|you|had|have|did|doing|got|getting|was|were|replacing|replaced|changing|changed|fitting|fitted|renewing|renewed|installing|installed|putting|put|in|on|its|customer's|shop's)){0,4}`;
const JOB = String.raw`(?: (?:job|work|change|replacement|service|kit|swap|repair|install|installation|done|replaced|changed|fitted|renewed|was done))?`;

interface Rule { tags: ContextTag[]; afterTrigger: string; anywhere?: string }

// Order matters: the belt rule runs before the timing rule so "timing belt job"
// reads as both, not timing alone. "Belt job" means the timing belt: accessory
// belts ("serpentine belt") fail the match because their word is not FILLER.
const RULES: Rule[] = [
  {
    tags: ['after-belt-job', 'after-timing-work'],
    afterTrigger: String.raw`(?:timing |cam ?)?belts?`,
    anywhere: String.raw`(?:(?:timing|cam) ?belt|belt) (?:job|change|replacement|service|kit)`,
  },
  {
    tags: ['after-timing-work'],
    afterTrigger: String.raw`(?:cam )?timing(?: (?:chain|chains|gears?|set|components?|marks?|cover|tensioner|guides?))?|timing chains?|chain`,
    anywhere: String.raw`timing(?: chain| gears?)? (?:job|work|replacement|service|kit)`,
  },
  {
    tags: ['after-engine-swap'],
    afterTrigger: String.raw`(?:(?:engine|motor) )?swap(?:ped)?(?! (?:of )?(?:the )?(?:coils?|injectors?|plugs?|sensors?|leads?))|(?:(?:new|used|replacement|rebuilt|reman|remanufactured|second-hand|secondhand) )?(?:engine|motor)(?= (?:swap|replacement|transplant|change|fitted|installed|went in|was fitted|was installed))(?: (?:swap|replacement|transplant|change))?|(?:swapping|swapped) (?:the |in )?(?:engine|motor)|(?:new|used|replacement|rebuilt|reman|remanufactured) (?:engine|motor)(?! (?:mounts?|oil|coolant|covers?|wiring|harness|sensors?|bay|loom|bolts?))`,
    anywhere: String.raw`(?:engine|motor) (?:swap|transplant|replacement)`,
  },
  {
    tags: ['after-tune'],
    afterTrigger: String.raw`(?:(?:ecu|ecm|pcm|engine|stage ?[1-3]) )?(?:tune|tuning|retune|re-tune|remap|re-map|remapped)(?![ -]?up${E})`,
    anywhere: String.raw`(?:stage ?[1-3] (?:tune|remap)|remapped|re-?map(?: (?:done|fitted)))`,
  },
  {
    tags: ['after-clutch-job'],
    afterTrigger: String.raw`clutch(?: (?:and|&) flywheel| kit| slave| master)?`,
    anywhere: String.raw`clutch (?:job|replacement|change|kit fitted)`,
  },
  {
    tags: ['after-brake-job'],
    afterTrigger: String.raw`(?:brakes?|brake pads?|pads?|rotors?|discs?|pads and (?:rotors|discs)|brake fluid)`,
    anywhere: String.raw`brake (?:job|work|service)|(?:pads|discs|rotors) (?:replaced|changed)`,
  },
  {
    tags: ['after-battery-change'],
    afterTrigger: String.raw`batter(?:y|ies)(?: (?:disconnect|disconnected|disconnection|was (?:disconnected|changed|replaced|flat)|went flat|died))?|(?:disconnecting|changing|replacing|swapping) (?:the )?battery|jump ?start(?:ing)?|jump-start(?:ing)?`,
    anywhere: String.raw`battery (?:change|replacement|swap|replaced|changed|disconnected)`,
  },
  {
    tags: ['after-programming'],
    afterTrigger: String.raw`(?:(?:ecu|ecm|pcm|tcm|module|software|computer) )?(?:programming|reprogramming|reprogram|program|flash|flashing|reflash|reflashing|update|updating|coding|recoding)|(?:ecu|ecm|pcm|tcm|module|computer|software) (?:(?:was|got|being|been) )?(?:flashed|reflashed|programmed|reprogrammed|updated|coded)|(?:flashing|reflashing|programming|coding|updating) (?:the )?(?:ecu|ecm|pcm|tcm|module|computer|software)|(?:code|coded|coding) the module`,
    anywhere: String.raw`(?:(?:ecu|ecm|pcm|tcm|module) (?:programming|reflash|flash|update|coding|software update))|reflashed|code the module|coded the module`,
  },
  {
    tags: ['after-accident-repair'],
    afterTrigger: String.raw`(?:accident|crash|collision|shunt|prang|body ?work|bodyshop|panel (?:repair|work)|front end (?:repair|damage)|(?:accident|collision|crash) (?:repair|damage))`,
    anywhere: String.raw`(?:accident|collision|crash) (?:repair|damage)`,
  },
];

const COMPILED = RULES.map((r) => ({
  tags: r.tags,
  afterTrigger: new RegExp(String.raw`${B}${TRIGGER}${FILLER} (?:${r.afterTrigger})${JOB}${E}`, 'giu'),
  anywhere: r.anywhere ? new RegExp(String.raw`${B}(?:${r.anywhere})${E}`, 'giu') : null,
}));

/** Without a trigger word only the "anywhere" phrases can match: most searches skip half the rules. */
const HAS_TRIGGER = new RegExp(String.raw`${B}(?:after|since|following|post)${E}`, 'iu');

export interface QueryContext { rest: string; context: ContextTag[] }

/** Finds recent-work phrases, masks them, returns context tags in table order. */
export function extractContext(text: string): QueryContext {
  const found = new Set<ContextTag>();
  const triggered = HAS_TRIGGER.test(text);
  let rest = text;
  for (const rule of COMPILED) {
    const res = [triggered ? rule.afterTrigger : null, rule.anywhere].filter((re): re is RegExp => re !== null);
    for (const re of res) {
      rest = consume(rest, re, () => {
        for (const t of rule.tags) found.add(t);
      });
    }
  }
  return { rest, context: CONTEXT_TAGS.filter((t) => found.has(t)) };
}
