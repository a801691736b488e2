// Fictional platforms and shop tags for the search tests (invented makes, models and engines).
import type { Platform } from '../../../shared/platform';

// V6 numbered alternately (odd on bank 1); firing order 1-2-3-4-5-6 then alternates banks,
// as an even-firing V6 must (a common 60-degree V6 order, from memory).
export const sableVt27: Platform = {
  id: 1, make: 'Aldwyn', model: 'Sable', engine: 'VT27', yearFrom: 2010, yearTo: 2016,
  cylinders: 6, layout: 'V', banks: { '1': [1, 3, 5], '2': [2, 4, 6] }, firingOrder: [1, 2, 3, 4, 5, 6],
  fuel: 'petrol', induction: 'natural',
};

// Same make and model, other engine: an inline 4, firing order 1-3-4-2 (references.md §6).
export const sableQl20: Platform = {
  id: 2, make: 'Aldwyn', model: 'Sable', engine: 'QL20', yearFrom: 2014, yearTo: 2020,
  cylinders: 4, layout: 'inline', firingOrder: [1, 3, 4, 2], fuel: 'petrol', induction: 'turbo',
};

// Same engine in another model of the same make.
export const marshVt27: Platform = {
  id: 3, make: 'Aldwyn', model: 'Marsh', engine: 'VT27', yearFrom: 2012, yearTo: 2018,
  cylinders: 6, layout: 'V', banks: { '1': [1, 3, 5], '2': [2, 4, 6] }, firingOrder: [1, 2, 3, 4, 5, 6],
  fuel: 'petrol', induction: 'natural',
};

// Another maker's V6 that numbers one bank after the other (1-3 on bank 1, 4-6 on bank 2).
export const tesselKx30: Platform = {
  id: 4, make: 'Corvane', model: 'Tessel', engine: 'KX-30', yearFrom: 2008, yearTo: 2015,
  cylinders: 6, layout: 'V', banks: { '1': [1, 2, 3], '2': [4, 5, 6] }, fuel: 'petrol', induction: 'natural',
};

// An unrelated inline 4.
export const fenM16: Platform = {
  id: 5, make: 'Brennock', model: 'Fen', engine: 'M16', yearFrom: 2005, yearTo: 2011,
  cylinders: 4, layout: 'inline', firingOrder: [1, 3, 4, 2], fuel: 'petrol', induction: 'natural',
};

export const platforms: Platform[] = [sableVt27, sableQl20, marshVt27, tesselKx30, fenM16];

export const symptomTags = [
  'rough-idle', 'shakes-at-idle', 'no-start', 'whistle-under-boost', 'hesitation', 'stalls',
  'misfire', 'cel-on', 'hard-start-when-hot',
];

export const ctx = { platforms, symptomTags };
