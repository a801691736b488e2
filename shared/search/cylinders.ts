// Cylinder mentions and misfire words in a query. Techs write cylinders many
// ways: "cyl 2 and 5", "cylinders 2 & 5", "#2 and #5", "cyl2/5", "cyls 1 3 5",
// "2 and 5 misfire", "misfire on 3", "2,5". A bare number only counts as a
// cylinder when something says so (a cylinder word, '#', a misfire word, or a
// compact list like "2,5"). Expects sanitised text (single spaces).
import { consume } from './text';

export const MAX_CYLINDER = 16;

const MISFIRE_RE =
  /(?<![\p{L}])(?:mis[ -]?fir(?:e|es|ed|ing)|misfier|missfire|miss(?:es|ing)?|stumbl(?:e|es|ed|ing)|dead (?:cyl(?:inder)?s?|hole|pot))(?![\p{L}])/iu;
const RANDOM_RE = /(?<![\p{L}])(?:random|multiple|multi|all (?:cyl(?:inder)?s?|cylinders))(?![\p{L}])/iu;

// A number that is not part of a bigger number, a decimal or a reading.
const UNIT = String.raw`(?:%|psi|kpa|bar|v|volts?|mv|ms|mm|deg|°|rpm|k|mph|kph|km|mi|miles|l|litres?|liters?|inhg|hz|a|amps?|ohms?|c|f|nm|sec|s|min|mins|minutes|years?|yrs?|months?|weeks?|wks?|days?|hours?|hrs?|times?|x)`;
const NUM = String.raw`\d{1,2}(?![\d]|\.\d| ?${UNIT}(?![\p{L}\p{N}]))`;
// "3/4 throttle" is a pedal position, not cylinders 3 and 4.
const NOT_FRACTION = String.raw`(?!(?:/\d+)? ?(?:throttle|load|pedal|tank|open|turns?|inch|in)(?![\p{L}]))`;
const SEP = String.raw`(?: ?(?:,|&|\+|/|and|or) ?| )`;
const LIST = String.raw`#?${NUM}(?:${SEP}(?:#|no\. ?)?${NUM})*`;
const CYL_WORD = String.raw`(?:cyl(?:inder)?s?|cylinders|cyl\.)`;
const MISFIRE_WORD = String.raw`(?:mis[ -]?fir(?:e|es|ed|ing)|misfier|missfire|miss(?:es|ing)?|stumbl(?:e|es|ed|ing)|dead)`;
const B = String.raw`(?<![\p{L}\p{N}])`;
const E = String.raw`(?![\p{L}\p{N}])`;

// Each rule: a regex whose group 1 is the number list; `needsMisfire` rules
// only apply when the query talks about misfire somewhere.
const RULES: { re: RegExp; needsMisfire: boolean }[] = [
  // cyl 2 and 5 / cylinders 2 & 5 / cyl2/5 / cyls 1 3 5 / cylinder #3 / cylinder no. 4
  { re: new RegExp(String.raw`${B}${CYL_WORD} ?(?:#|no\.? ?|number )?(${LIST})${E}`, 'giu'), needsMisfire: false },
  // 2 and 5 cylinders / #2 cylinder / number 3 cylinder
  { re: new RegExp(String.raw`${B}(?:number |no\. ?)?(${LIST}) ?${CYL_WORD}${E}`, 'giu'), needsMisfire: false },
  // #2 and #5
  { re: new RegExp(String.raw`(?<![\p{L}\p{N}#])(#${LIST})${E}`, 'giu'), needsMisfire: false },
  // 2 and 5 misfire / 3 missing
  { re: new RegExp(String.raw`${B}(${LIST}) (?=${MISFIRE_WORD}${E})`, 'giu'), needsMisfire: false },
  // misfire on 2 and 5 / missing 3 / dead 4
  { re: new RegExp(String.raw`(?<=${B}${MISFIRE_WORD} (?:on |in |at )?)(${LIST})${E}${NOT_FRACTION}`, 'giu'), needsMisfire: false },
  // 2,5 / 1&4: compact lists need no other hint (slashes do: 3/4 is often a fraction)
  { re: new RegExp(String.raw`${B}(${NUM}(?:[,&+]${NUM})+)${E}`, 'giu'), needsMisfire: false },
  // 2 and 5 / 2, 5 / 2/5 anywhere in a misfire query
  { re: new RegExp(String.raw`${B}(${NUM}(?:${SEP}${NUM})+)${E}${NOT_FRACTION}`, 'giu'), needsMisfire: true },
];

function numbersIn(list: string): number[] {
  return [...list.matchAll(/\d{1,2}/g)].map((m) => Number(m[0])).filter((n) => n >= 1 && n <= MAX_CYLINDER);
}

export interface QueryCylinders {
  rest: string;
  cylinders: number[];
  misfire: boolean;
  /** "random misfire", "multiple cylinders": P0300 territory */
  randomMisfire: boolean;
}

/** Finds cylinder numbers and masks their mentions; misfire words stay in the text. */
export function extractCylinders(text: string): QueryCylinders {
  const misfire = MISFIRE_RE.test(text);
  const found = new Set<number>();
  let rest = text;
  for (const rule of RULES) {
    if (rule.needsMisfire && !misfire) continue;
    rest = consume(rest, rule.re, (m) => {
      const nums = numbersIn(m[1] ?? '');
      if (nums.length === 0) return false;
      for (const n of nums) found.add(n);
      return true;
    });
  }
  return {
    rest,
    cylinders: [...found].sort((a, b) => a - b),
    misfire,
    randomMisfire: misfire && RANDOM_RE.test(text),
  };
}
