/**
 * Units for workshop readings: parse the spellings techs type, convert within a
 * quantity, and check a reading against a spec.
 * Factors from NIST SP 811 Appendix B.8 (references.md §6); bar, inch and the
 * time and temperature relations are exact by definition.
 * Pressure is treated as one quantity: gauge versus absolute is the spec's business.
 */
import { z } from 'zod';

export const UNITS = [
  'psi', 'kPa', 'bar', 'inHg',
  'degC', 'degF', 'K',
  'lbf.ft', 'N.m',
  'V', 'mV',
  'ohm', 'kohm',
  'A', 'mA',
  'ms', 's', 'min',
  '%',
  'deg',
  'rpm',
  'mm', 'in',
] as const;

export type Unit = (typeof UNITS)[number];

export type Quantity =
  | 'pressure' | 'temperature' | 'torque' | 'voltage' | 'resistance' | 'current'
  | 'time' | 'percent' | 'angle' | 'speed' | 'length';

export class UnitError extends Error {
  override name = 'UnitError';
}

/** Linear units: value_in_base = value * factor. Temperature is affine and handled apart. */
interface UnitDef { quantity: Quantity; factor: number; label: string }

const DEFS: Record<Unit, UnitDef> = {
  kPa: { quantity: 'pressure', factor: 1, label: 'kPa' },
  psi: { quantity: 'pressure', factor: 6.894757, label: 'psi' }, // NIST SP 811 B.8
  inHg: { quantity: 'pressure', factor: 3.386389, label: 'inHg' }, // NIST SP 811 B.8, conventional
  bar: { quantity: 'pressure', factor: 100, label: 'bar' }, // exact
  K: { quantity: 'temperature', factor: 1, label: 'K' },
  degC: { quantity: 'temperature', factor: 1, label: '°C' },
  degF: { quantity: 'temperature', factor: 5 / 9, label: '°F' },
  'N.m': { quantity: 'torque', factor: 1, label: 'N·m' },
  'lbf.ft': { quantity: 'torque', factor: 1.355818, label: 'lbf·ft' }, // NIST SP 811 B.8
  V: { quantity: 'voltage', factor: 1, label: 'V' },
  mV: { quantity: 'voltage', factor: 0.001, label: 'mV' },
  ohm: { quantity: 'resistance', factor: 1, label: 'ohm' },
  kohm: { quantity: 'resistance', factor: 1000, label: 'kohm' },
  A: { quantity: 'current', factor: 1, label: 'A' },
  mA: { quantity: 'current', factor: 0.001, label: 'mA' },
  s: { quantity: 'time', factor: 1, label: 's' },
  ms: { quantity: 'time', factor: 0.001, label: 'ms' },
  min: { quantity: 'time', factor: 60, label: 'min' },
  '%': { quantity: 'percent', factor: 1, label: '%' },
  deg: { quantity: 'angle', factor: 1, label: 'deg' },
  rpm: { quantity: 'speed', factor: 1, label: 'rpm' },
  mm: { quantity: 'length', factor: 1, label: 'mm' },
  in: { quantity: 'length', factor: 25.4, label: 'in' }, // exact
};

/** Spellings accepted by parseUnit, keyed by a folded form (lower case, no spaces, dots or dashes). */
const SPELLINGS: Record<Unit, string[]> = {
  psi: ['psi', 'psig', 'lb/in2', 'lbf/in2', 'lb/in²', 'lbf/in²'],
  kPa: ['kpa', 'kilopascal', 'kilopascals'],
  bar: ['bar', 'bars'],
  inHg: ['inhg', 'in.hg', '"hg', 'inchhg', 'inchesofmercury', 'inofmercury', 'inchesmercury'],
  degC: ['degc', 'degreesc', 'degreec', '°c', 'c', 'celsius', 'degcelsius', 'degreescelsius', '℃'],
  degF: ['degf', 'degreesf', 'degreef', '°f', 'f', 'fahrenheit', 'degreesfahrenheit', '℉'],
  K: ['k', 'kelvin'],
  'lbf.ft': [
    'lbf.ft', 'lbfft', 'lbft', 'lb.ft', 'lbsft', 'ftlb', 'ftlbs', 'ftlbf', 'ft.lb', 'ft.lbf', 'lbf·ft', 'lb·ft', 'ft·lb',
    'footpound', 'footpounds', 'poundfoot', 'poundfeet',
  ],
  'N.m': ['n.m', 'nm', 'n·m', 'newtonmetre', 'newtonmetres', 'newtonmeter', 'newtonmeters'],
  V: ['v', 'volt', 'volts', 'vdc'],
  mV: ['mv', 'millivolt', 'millivolts'],
  ohm: ['ohm', 'ohms', 'Ω', 'Ω'],
  kohm: ['kohm', 'kohms', 'kΩ', 'kΩ', 'kilohm', 'kilohms', 'kiloohm', 'kiloohms'],
  A: ['a', 'amp', 'amps', 'ampere', 'amperes'],
  mA: ['ma', 'milliamp', 'milliamps', 'milliampere', 'milliamperes'],
  ms: ['ms', 'msec', 'millisecond', 'milliseconds'],
  s: ['s', 'sec', 'secs', 'second', 'seconds'],
  min: ['min', 'mins', 'minute', 'minutes'],
  '%': ['%', 'percent', 'pct', 'per cent'],
  deg: ['deg', 'degs', 'degree', 'degrees', '°', 'degca', '°ca', 'degreesca', 'crankdegrees', 'crankdeg'],
  rpm: ['rpm', 'r/min', 'rev/min', 'revmin', 'revs/min'],
  mm: ['mm', 'millimetre', 'millimetres', 'millimeter', 'millimeters'],
  in: ['in', 'in.', 'inch', 'inches', '"'],
};

const fold = (text: string): string => text.trim().toLowerCase().replace(/[\s_-]+/g, '');

const LOOKUP: ReadonlyMap<string, Unit> = new Map(
  (Object.entries(SPELLINGS) as [Unit, string[]][]).flatMap(([unit, names]) =>
    [unit, ...names].map((name) => [fold(name), unit] as const),
  ),
);

/** Canonical unit for a spelling, or undefined. Case-insensitive; 'degrees' alone is an angle. */
export function tryParseUnit(text: string): Unit | undefined {
  return LOOKUP.get(fold(text));
}

export function parseUnit(text: string): Unit {
  const unit = tryParseUnit(text);
  if (!unit) throw new UnitError(`"${text}" is not a unit Causeway knows`);
  return unit;
}

/** Canonical unit ids; accepts any spelling parseUnit knows and stores the canonical id. */
export const unitSchema = z.preprocess(
  (value) => (typeof value === 'string' ? (tryParseUnit(value) ?? value) : value),
  z.enum(UNITS),
);

export function quantityOf(unit: Unit): Quantity {
  return DEFS[unit].quantity;
}

export function unitLabel(unit: Unit): string {
  return DEFS[unit].label;
}

function toKelvin(value: number, unit: Unit): number {
  if (unit === 'degC') return value + 273.15;
  if (unit === 'degF') return (value - 32) * (5 / 9) + 273.15;
  return value;
}

function fromKelvin(value: number, unit: Unit): number {
  if (unit === 'degC') return value - 273.15;
  if (unit === 'degF') return (value - 273.15) * (9 / 5) + 32;
  return value;
}

export function convert(value: number, from: Unit, to: Unit): number {
  const a = DEFS[from];
  const b = DEFS[to];
  if (a.quantity !== b.quantity) {
    throw new UnitError(`${a.label} (${a.quantity}) cannot be converted to ${b.label} (${b.quantity})`);
  }
  if (from === to) return value;
  if (a.quantity === 'temperature') return fromKelvin(toKelvin(value, from), to);
  return (value * a.factor) / b.factor;
}

/** A readable number: integers above 1000, otherwise 4 significant figures. */
export function formatNumber(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  const rounded = Math.abs(value) >= 1000 ? Math.round(value) : Number(value.toPrecision(4));
  return String(Object.is(rounded, -0) ? 0 : rounded);
}

export function formatReading(value: number, unit: Unit): string {
  return `${formatNumber(value)} ${unitLabel(unit)}`;
}

export interface Spec {
  min?: number;
  max?: number;
  unit: Unit;
  text?: string;
}

export interface Reading {
  value: number;
  unit: Unit;
}

export interface ReadingCheck {
  verdict: 'in' | 'out';
  valueInSpecUnit: number;
  reason: string;
}

/** Conversion round-off must not turn a reading on the limit into a fail. */
const within = (value: number, limit: number, side: 'min' | 'max'): boolean => {
  const slack = 1e-9 * Math.max(1, Math.abs(limit));
  return side === 'min' ? value >= limit - slack : value <= limit + slack;
};

export function describeSpec(spec: Spec): string {
  const u = unitLabel(spec.unit);
  if (spec.min !== undefined && spec.max !== undefined) {
    if (spec.min === -spec.max && spec.max > 0) return `±${formatNumber(spec.max)} ${u}`;
    const joiner = spec.min < 0 ? ' to ' : '–';
    return `${formatNumber(spec.min)}${joiner}${formatNumber(spec.max)} ${u}`;
  }
  if (spec.min !== undefined) return `at least ${formatReading(spec.min, spec.unit)}`;
  if (spec.max !== undefined) return `at most ${formatReading(spec.max, spec.unit)}`;
  return spec.text ?? 'no limits given';
}

export function checkReading(reading: Reading, spec: Spec): ReadingCheck {
  if (quantityOf(reading.unit) !== quantityOf(spec.unit)) {
    throw new UnitError(
      `${unitLabel(reading.unit)} (${quantityOf(reading.unit)}) cannot be compared with ` +
        `${unitLabel(spec.unit)} (${quantityOf(spec.unit)})`,
    );
  }
  const value = convert(reading.value, reading.unit, spec.unit);
  const shown =
    reading.unit === spec.unit
      ? formatReading(value, spec.unit)
      : `${formatReading(reading.value, reading.unit)} (${formatReading(value, spec.unit)})`;
  const limits = describeSpec(spec);
  if (spec.min !== undefined && !within(value, spec.min, 'min')) {
    return { verdict: 'out', valueInSpecUnit: value, reason: `${shown} is below the spec (${limits})` };
  }
  if (spec.max !== undefined && !within(value, spec.max, 'max')) {
    return { verdict: 'out', valueInSpecUnit: value, reason: `${shown} is above the spec (${limits})` };
  }
  return { verdict: 'in', valueInSpecUnit: value, reason: `${shown} is within the spec (${limits})` };
}

export interface FoundMeasurement {
  value: number;
  unit: Unit;
  raw: string;
}

/**
 * Unit spellings looked for in free text, longest first so 'kohm' wins over 'ohm'.
 * Bare letters that are often words or abbreviations ('a', 'k', 'in' before a word)
 * are left out or guarded; a miss is cheaper than a wrong reading in a case note.
 */
const TEXT_UNITS: [string, Unit][] = [
  ['inches of mercury', 'inHg'], ['in\\.?\\s?hg', 'inHg'], ['"\\s?hg', 'inHg'],
  ['kilopascals?', 'kPa'], ['kpa', 'kPa'], ['psig?', 'psi'], ['bars?', 'bar'],
  ['°\\s?c(?![a-z])', 'degC'], ['°\\s?f', 'degF'], ['deg(?:rees)?\\s?c(?![a-z])', 'degC'], ['deg(?:rees)?\\s?f', 'degF'],
  ['celsius', 'degC'], ['fahrenheit', 'degF'],
  ['lbf?[.·\\s-]?ft', 'lbf.ft'], ['ft[.·\\s-]?lb[fs]?', 'lbf.ft'], ['n[.·\\s-]?m', 'N.m'],
  ['millivolts?', 'mV'], ['mv', 'mV'], ['volts?', 'V'], ['v(?:dc)?', 'V'],
  ['kilohms?', 'kohm'], ['k\\s?ohms?', 'kohm'], ['k\\s?[ΩΩ]', 'kohm'], ['ohms?', 'ohm'], ['[ΩΩ]', 'ohm'],
  ['milliamps?', 'mA'], ['ma', 'mA'], ['amps?', 'A'],
  ['milliseconds?', 'ms'], ['msec', 'ms'], ['ms', 'ms'], ['minutes?', 'min'], ['mins?', 'min'],
  ['seconds?', 's'], ['secs?', 's'],
  ['percent', '%'], ['%', '%'],
  ['degrees?', 'deg'], ['degs?', 'deg'], ['°', 'deg'],
  ['rpm', 'rpm'], ['r/min', 'rpm'],
  ['millimet(?:re|er)s?', 'mm'], ['mm', 'mm'], ['inch(?:es)?', 'in'], ['in(?!\\s+[a-z])', 'in'],
];

/** Case-sensitive on purpose: a lone 'A' after a number is amps, a lone 'a' is a word. */
const CASED_UNITS: [string, Unit][] = [['A', 'A'], ['C', 'degC'], ['F', 'degF'], ['s', 's']];

const NUMBER = String.raw`(?<![\w.,])([+\-−]?(?:\d{1,3}(?:,\d{3})+|\d+)(?:\.\d+)?)`;
const END = String.raw`(?![\p{L}\p{N}])`;

const group = (units: [string, Unit][]) => units.map(([pattern]) => `(${pattern})`).join('|');
const TEXT_RE = new RegExp(`${NUMBER}\\s?(?:${group(TEXT_UNITS)})${END}`, 'giu');
const CASED_RE = new RegExp(`${NUMBER}\\s?(?:${group(CASED_UNITS)})${END}`, 'gu');

function scan(text: string, re: RegExp, units: [string, Unit][]): (FoundMeasurement & { index: number })[] {
  const found: (FoundMeasurement & { index: number })[] = [];
  for (const match of text.matchAll(re)) {
    const numberText = match[1];
    const unitIndex = match.slice(2).findIndex((part) => part !== undefined);
    const unit = units[unitIndex]?.[1];
    if (numberText === undefined || unit === undefined) continue;
    const value = Number(numberText.replace('−', '-').replace(/,/g, ''));
    if (Number.isFinite(value)) found.push({ value, unit, raw: match[0], index: match.index });
  }
  return found;
}

/** Readings with units in free text, in the order they appear ('15 psi', '-8%', '14.4V'). */
export function findMeasurements(text: string): FoundMeasurement[] {
  const all = [...scan(text, TEXT_RE, TEXT_UNITS), ...scan(text, CASED_RE, CASED_UNITS)];
  const taken = new Set<number>();
  return all
    .sort((a, b) => a.index - b.index)
    .filter((m) => !taken.has(m.index) && taken.add(m.index))
    .map(({ value, unit, raw }) => ({ value, unit, raw }));
}
