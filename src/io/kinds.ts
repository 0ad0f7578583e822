import type { MeasurementKind } from '../core/types';

/**
 * Words the trade writes in a "kind" column, mapped to the kinds of `src/core/types.ts`.
 * Matching ignores case, surrounding space, punctuation (`_ - .`), a trailing plural "s",
 * and a leading fold-generation tag (`F1 `, `F2 `...). A word not in this table is not
 * guessed at: {@link normalizeKind} returns undefined and the reader reports the row.
 *
 * | kind | words (common practice) |
 * |---|---|
 * | bedding | bedding, bed, bedding plane, S0, so, stratification, strata |
 * | foliation | foliation, fol, S1, S2, S3, S4, schistosity, gneissosity |
 * | cleavage | cleavage, clv, cl, slaty cleavage, crenulation cleavage, spaced cleavage |
 * | joint | joint, jt, jnt, fracture, frac |
 * | fault | fault, flt, fault plane, shear plane |
 * | vein | vein, vn, veinlet |
 * | axial-plane | axial plane, axial surface, axial planar, ap, axp, fold axial plane |
 * | contact | contact, ctc, lithological contact, boundary |
 * | plane | plane, planar, generic plane |
 * | lineation | lineation, lin, l, L1, L2, L3, stretching lineation |
 * | hinge | hinge, hinge line, fold hinge, fold axis, fold axes, axis, b axis |
 * | intersection | intersection, intersection lineation, int, L0-1 |
 * | slickenline | slickenline, slickenside lineation, slick, striation, striae, slickenside |
 * | mineral-lineation | mineral lineation, mineral-lineation, min lin, mineral |
 * | line | line, linear, generic line |
 *
 * A generation tag goes with hinge, axial-plane and the S/L surfaces: "F1 hinge", "F2 axial plane".
 */
const KIND_WORDS: Readonly<Record<string, MeasurementKind>> = {
  bedding: 'bedding',
  bed: 'bedding',
  'bedding plane': 'bedding',
  s0: 'bedding',
  so: 'bedding',
  stratification: 'bedding',
  strata: 'bedding',
  foliation: 'foliation',
  fol: 'foliation',
  s1: 'foliation',
  s2: 'foliation',
  s3: 'foliation',
  s4: 'foliation',
  schistosity: 'foliation',
  gneissosity: 'foliation',
  cleavage: 'cleavage',
  clv: 'cleavage',
  cl: 'cleavage',
  'slaty cleavage': 'cleavage',
  'crenulation cleavage': 'cleavage',
  'spaced cleavage': 'cleavage',
  joint: 'joint',
  jt: 'joint',
  jnt: 'joint',
  fracture: 'joint',
  frac: 'joint',
  fault: 'fault',
  flt: 'fault',
  'fault plane': 'fault',
  'shear plane': 'fault',
  vein: 'vein',
  vn: 'vein',
  veinlet: 'vein',
  'axial plane': 'axial-plane',
  'axial surface': 'axial-plane',
  'axial planar': 'axial-plane',
  ap: 'axial-plane',
  axp: 'axial-plane',
  'fold axial plane': 'axial-plane',
  contact: 'contact',
  ctc: 'contact',
  'lithological contact': 'contact',
  boundary: 'contact',
  plane: 'plane',
  planar: 'plane',
  'generic plane': 'plane',
  lineation: 'lineation',
  lin: 'lineation',
  l: 'lineation',
  l1: 'lineation',
  l2: 'lineation',
  l3: 'lineation',
  'stretching lineation': 'lineation',
  hinge: 'hinge',
  'hinge line': 'hinge',
  'fold hinge': 'hinge',
  'fold axis': 'hinge',
  'fold axe': 'hinge', // "fold axes" after the plural is dropped
  axis: 'hinge',
  'b axis': 'hinge',
  intersection: 'intersection',
  'intersection lineation': 'intersection',
  int: 'intersection',
  'l0 1': 'intersection',
  slickenline: 'slickenline',
  'slickenside lineation': 'slickenline',
  slick: 'slickenline',
  striation: 'slickenline',
  striae: 'slickenline',
  slickenside: 'slickenline',
  'mineral lineation': 'mineral-lineation',
  'min lin': 'mineral-lineation',
  mineral: 'mineral-lineation',
  line: 'line',
  linear: 'line',
  'generic line': 'line',
};

/** The kind words as [word, kind] pairs, for documentation and tests. */
export const KIND_WORD_TABLE: readonly (readonly [string, MeasurementKind])[] = Object.entries(KIND_WORDS);

/**
 * The kind a field word names, or undefined when the word is not one the trade uses for a kind.
 * @example
 * normalizeKind('S0') // 'bedding'
 * normalizeKind('F1 hinge') // 'hinge'
 * normalizeKind('Fold axes') // 'hinge'
 * normalizeKind('pebble') // undefined
 */
export function normalizeKind(word: string): MeasurementKind | undefined {
  const base = word
    .trim()
    .toLowerCase()
    .replace(/[_.\-/]+/g, ' ')
    .replace(/\s+/g, ' ')
    .trim();
  if (base === '') return undefined;
  for (const candidate of candidates(base)) {
    const kind = KIND_WORDS[candidate];
    if (kind !== undefined) return kind;
  }
  return undefined;
}

function candidates(base: string): string[] {
  const out = [base];
  // "F1 hinge", "F2 axial plane": the generation tag does not change the kind.
  const untagged = base.replace(/^f\d+\s+/, '');
  if (untagged !== base && untagged !== '') out.push(untagged);
  for (const w of [...out]) if (w.length > 3 && w.endsWith('s')) out.push(w.slice(0, -1));
  return out;
}
