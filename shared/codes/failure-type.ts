// Failure type byte (FTB) of a 3-byte DTC, SAE J2012-DA / ISO 15031-6.
// Categories by high nibble and the examples marked [S] are from references.md §1;
// the other meanings are plain wording from memory of the public list [M].

export const ftbCategories: Record<string, string> = {
  '0': 'general failure information',
  '1': 'general electrical failure',
  '2': 'general signal failure',
  '3': 'FM/PWM failure',
  '4': 'system internal failure',
  '5': 'system programming failure',
  '6': 'algorithm based failure',
  '7': 'mechanical failure',
  '8': 'bus signal or message failure',
  '9': 'component failure',
  A: 'reserved',
  B: 'reserved',
  C: 'reserved',
  D: 'reserved',
  E: 'reserved',
  F: 'manufacturer specific',
};

const meanings: Record<string, string> = {
  '00': 'no sub-type information',
  '01': 'general electrical failure',
  '02': 'general signal failure',
  '03': 'FM/PWM failure',
  '04': 'system internal failure',
  '05': 'system programming failure',
  '06': 'algorithm based failure',
  '07': 'mechanical failure',
  '08': 'bus signal or message failure',
  '09': 'component failure',
  '11': 'circuit short to ground', // [S]
  '12': 'circuit short to battery', // [S]
  '13': 'circuit open', // [S]
  '14': 'circuit short to ground or open',
  '15': 'circuit short to battery or open', // [S]
  '16': 'circuit voltage below threshold',
  '17': 'circuit voltage above threshold',
  '18': 'circuit current below threshold',
  '19': 'circuit current above threshold',
  '1A': 'circuit resistance below threshold',
  '1B': 'circuit resistance above threshold',
  '1C': 'circuit voltage out of range',
  '1D': 'circuit current out of range',
  '1E': 'circuit resistance out of range',
  '1F': 'circuit intermittent', // [S]
  '21': 'signal amplitude below minimum',
  '22': 'signal amplitude above maximum',
  '23': 'signal stuck low',
  '24': 'signal stuck high',
  '25': 'signal shape or waveform failure',
  '26': 'signal rate of change below threshold',
  '27': 'signal rate of change above threshold',
  '28': 'signal bias level out of range or zero adjustment failure',
  '29': 'signal invalid',
  '2F': 'signal erratic',
  '31': 'no signal', // [S]
  '32': 'signal low time below minimum',
  '33': 'signal low time above maximum',
  '34': 'signal high time below minimum',
  '35': 'signal high time above maximum',
  '36': 'signal frequency too low',
  '37': 'signal frequency too high',
  '38': 'signal frequency incorrect',
  '39': 'too few pulses',
  '3A': 'too many pulses',
  '41': 'general checksum failure',
  '42': 'general memory failure',
  '43': 'special memory failure',
  '44': 'data memory failure',
  '45': 'program memory failure',
  '46': 'calibration or parameter memory failure',
  '47': 'watchdog or safety processor failure',
  '48': 'supervision software failure',
  '49': 'internal electronic failure',
  '4A': 'incorrect component installed',
  '4B': 'over temperature',
  '51': 'not programmed',
  '52': 'not activated',
  '53': 'deactivated',
  '54': 'missing calibration',
  '55': 'not configured',
  '61': 'signal calculation failure',
  '62': 'signal compare failure',
  '63': 'circuit or component protection time-out',
  '64': 'signal plausibility failure', // [S]
  '65': 'signal has too few transitions or events',
  '66': 'signal has too many transitions or events',
  '67': 'signal incorrect after event',
  '68': 'event information',
  '71': 'actuator stuck', // [S]
  '72': 'actuator stuck open',
  '73': 'actuator stuck closed',
  '74': 'actuator slipping',
  '75': 'emergency position not reachable',
  '76': 'wrong mounting position',
  '77': 'commanded position not reachable',
  '78': 'alignment or adjustment incorrect',
  '79': 'mechanical linkage failure',
  '7A': 'fluid leak or seal failure',
  '7B': 'low fluid level',
  '81': 'invalid serial data received',
  '82': 'alive or sequence counter incorrect or not updated',
  '83': 'signal protection value incorrect',
  '84': 'signal below allowable range',
  '85': 'signal above allowable range',
  '86': 'signal invalid',
  '87': 'missing message', // [S]
  '88': 'bus off',
  '8F': 'erratic',
  '91': 'parametric',
  '92': 'performance or incorrect operation',
  '93': 'no operation',
  '94': 'unexpected operation',
  '95': 'incorrect assembly',
  '96': 'component internal failure', // [S]
  '97': 'component or system operation obstructed or blocked',
  '98': 'component or system over temperature',
};

export interface FtbDescription {
  /** two upper hex digits */
  value: string;
  /** what the high nibble says */
  category: string;
  /** the specific meaning, or null where the list gives none */
  meaning: string | null;
}

function normaliseFtb(ftb: string | number): string {
  if (typeof ftb === 'number') {
    if (!Number.isInteger(ftb) || ftb < 0 || ftb > 0xff) throw new RangeError(`failure type byte must be 0-255, got ${ftb}`);
    return ftb.toString(16).toUpperCase().padStart(2, '0');
  }
  const s = ftb.trim().toUpperCase().replace(/^0X/, '');
  if (!/^[0-9A-F]{2}$/.test(s)) throw new RangeError(`failure type byte must be two hex digits, got "${ftb}"`);
  return s;
}

/** describeFtb('13') or describeFtb(0x13) -> circuit open, general electrical failure. */
export function describeFtb(ftb: string | number): FtbDescription {
  const value = normaliseFtb(ftb);
  const category = ftbCategories[value.charAt(0)] ?? 'reserved';
  return { value, category, meaning: meanings[value] ?? null };
}
