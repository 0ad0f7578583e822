import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import {
  NotationError,
  NotationProblem,
  azimuthToBearing,
  bearingToAzimuth,
  detectPlaneNotation,
  formatLine,
  formatPlane,
  inSector,
  parseAzimuth,
  parseDip,
  parseLine,
  parseOverturnedFlag,
  parsePlane,
  parsePlunge,
  pickOpposite,
  planeFromStrikeDip,
  sectorOf,
  type LineFormat,
  type LineNotation,
  type PlaneFormat,
  type PlaneNotation,
  tryParseAzimuth,
  tryParseDip,
  tryParseLine,
  tryParsePlane,
  tryParsePlunge,
} from '../../src/core/notation';
import type { Line, PlaneMeasurement } from '../../src/core/types';
import { expectAzimuth, expectClose, expectDeepClose } from '../helpers/tolerance';
import { fuzzRuns, fuzzTimeout } from '../helpers/fuzzRuns';

/** Runs f and returns the NotationError it throws; fails the test if it returns or throws anything else. */
function notationErrorOf(f: () => unknown): NotationError {
  try {
    f();
  } catch (e) {
    if (e instanceof NotationError) return e;
    expect.fail(`expected a NotationError, got ${String(e)}`);
  }
  expect.fail('expected a NotationError, but the call returned');
}

const TOL = 1e-9;

// Sources used below:
//   DD   common practice: dip direction/dip is written dip direction first.
//   RHR  common practice (REFERENCES.md): right-hand rule, dip direction = strike + 90.
//   SQ   common practice: strike/dip with the dip quadrant; the letters pick one of strike ± 90.
//   QB   common practice: quadrant bearing N a E = a, N a W = 360 - a, S a E = 180 - a, S a W = 180 + a.
//   COE  Coe (ed.) 2010, Geological Field Techniques, fig. 2.6: 008/12E is 098/12 (published).
//   RULE our documented rule in src/core/notation.ts (quarters closed, halves open; values kept as written).
describe('parsePlane reference table: accepted', () => {
  const rows: { text: string; notation: PlaneNotation; expected: PlaneMeasurement; source: string }[] = [
    { text: '120/45', notation: 'dipdir', expected: { dipDirection: 120, dip: 45 }, source: 'DD' },
    { text: '120 45', notation: 'dipdir', expected: { dipDirection: 120, dip: 45 }, source: 'DD' },
    { text: '120/45°', notation: 'dipdir', expected: { dipDirection: 120, dip: 45 }, source: 'DD, degree sign' },
    { text: '120°/45°', notation: 'dipdir', expected: { dipDirection: 120, dip: 45 }, source: 'DD, degree signs' },
    { text: ' 120 / 45 ', notation: 'dipdir', expected: { dipDirection: 120, dip: 45 }, source: 'DD, spaces around' },
    { text: '120\t45º', notation: 'dipdir', expected: { dipDirection: 120, dip: 45 }, source: 'DD, tab and ordinal sign for °' },
    { text: '359.5/89.5', notation: 'dipdir', expected: { dipDirection: 359.5, dip: 89.5 }, source: 'DD, decimals' },
    { text: '0/0', notation: 'dipdir', expected: { dipDirection: 0, dip: 0 }, source: 'DD, unpadded' },
    { text: '120/00', notation: 'dipdir', expected: { dipDirection: 120, dip: 0 }, source: 'RULE: horizontal keeps its dip direction' },
    { text: '120/90', notation: 'dipdir', expected: { dipDirection: 120, dip: 90 }, source: 'RULE: vertical keeps its side' },
    { text: 'S60E/45', notation: 'dipdir', expected: { dipDirection: 120, dip: 45 }, source: 'QB: S60E = 120' },
    { text: '120/45 OT', notation: 'dipdir', expected: { dipDirection: 120, dip: 45, overturned: true }, source: 'RULE: flag carried' },
    { text: '120/45 overturned', notation: 'dipdir', expected: { dipDirection: 120, dip: 45, overturned: true }, source: 'RULE' },
    { text: '030/45', notation: 'rhr', expected: { dipDirection: 120, dip: 45 }, source: 'RHR' },
    { text: '300/30', notation: 'rhr', expected: { dipDirection: 30, dip: 30 }, source: 'RHR, wraps past 360' },
    { text: '270 10', notation: 'rhr', expected: { dipDirection: 0, dip: 10 }, source: 'RHR, wraps to 000' },
    { text: 'S30W/45', notation: 'rhr', expected: { dipDirection: 300, dip: 45 }, source: 'RHR with QB strike 210' },
    { text: '030/45SE', notation: 'strike-quadrant', expected: { dipDirection: 120, dip: 45 }, source: 'SQ' },
    { text: '210/45SE', notation: 'strike-quadrant', expected: { dipDirection: 120, dip: 45 }, source: 'SQ, other strike end' },
    { text: '030/45NW', notation: 'strike-quadrant', expected: { dipDirection: 300, dip: 45 }, source: 'SQ' },
    { text: '030/45E', notation: 'strike-quadrant', expected: { dipDirection: 120, dip: 45 }, source: 'SQ, RULE one letter = half' },
    { text: '030/45S', notation: 'strike-quadrant', expected: { dipDirection: 120, dip: 45 }, source: 'SQ, RULE' },
    { text: '030/45N', notation: 'auto', expected: { dipDirection: 300, dip: 45 }, source: 'SQ, RULE' },
    { text: '030/45 se', notation: 'auto', expected: { dipDirection: 120, dip: 45 }, source: 'SQ, lower case, spaced' },
    { text: '008/12E', notation: 'strike-quadrant', expected: { dipDirection: 98, dip: 12 }, source: 'COE' },
    { text: '030/45SE', notation: 'auto', expected: { dipDirection: 120, dip: 45 }, source: 'SQ is self-describing' },
    { text: '000/45NE', notation: 'auto', expected: { dipDirection: 90, dip: 45 }, source: 'RULE: quarters include their boundaries' },
    { text: '030/90SE', notation: 'auto', expected: { dipDirection: 120, dip: 90 }, source: 'SQ, vertical keeps the side written' },
    { text: '030/60SE overturned', notation: 'auto', expected: { dipDirection: 120, dip: 60, overturned: true }, source: 'SQ + RULE' },
    { text: 'N30E 45SE', notation: 'quadrant', expected: { dipDirection: 120, dip: 45 }, source: 'QB + SQ' },
    { text: 'S45W/60NW', notation: 'quadrant', expected: { dipDirection: 315, dip: 60 }, source: 'QB: S45W = 225; NW picks 315' },
    { text: 'N30E/45SE', notation: 'auto', expected: { dipDirection: 120, dip: 45 }, source: 'QB + SQ' },
    { text: 'n30e 45se', notation: 'auto', expected: { dipDirection: 120, dip: 45 }, source: 'QB, lower case' },
    { text: 'N30°E 45°SE', notation: 'auto', expected: { dipDirection: 120, dip: 45 }, source: 'QB, degree signs' },
    { text: 'N90E 30S', notation: 'auto', expected: { dipDirection: 180, dip: 30 }, source: 'QB: east-west strike' },
    { text: 'N0E 30E', notation: 'quadrant', expected: { dipDirection: 90, dip: 30 }, source: 'QB: north-south strike' },
    { text: 'N30E 45 SE OT', notation: 'auto', expected: { dipDirection: 120, dip: 45, overturned: true }, source: 'QB + RULE' },
  ];
  for (const { text, notation, expected } of rows) {
    it(`parsePlane(${JSON.stringify(text)}, '${notation}') gives ${JSON.stringify(expected)}`, () => {
      const got = parsePlane(text, notation);
      expectDeepClose(got, expected, TOL);
      expect(got.overturned === true).toBe(expected.overturned === true);
    });
  }
});

describe('parsePlane reference table: rejected with the problem named', () => {
  const rows: { text: string; notation: PlaneNotation; problem: RegExp; source: string }[] = [
    { text: '', notation: 'auto', problem: /empty/, source: 'RULE' },
    { text: '   ', notation: 'dipdir', problem: /empty/, source: 'RULE' },
    { text: '030/45', notation: 'auto', problem: /could be a dip direction .* or a strike/, source: 'RULE: bare pair is ambiguous' },
    { text: '120 45', notation: 'auto', problem: /no dip quadrant.*name|notation named/, source: 'RULE' },
    { text: 'N30E/45', notation: 'auto', problem: /no dip quadrant/, source: 'RULE' },
    { text: '030/45NE', notation: 'auto', problem: /NE lies along strike 030/, source: 'SQ: NE holds the strike itself' },
    { text: '030/45SW', notation: 'strike-quadrant', problem: /SW lies along strike 030/, source: 'SQ' },
    { text: '090/30E', notation: 'auto', problem: /E lies along strike 090/, source: 'SQ, RULE halves open' },
    { text: 'N30E 45NE', notation: 'quadrant', problem: /NE lies along strike N30E/, source: 'QB + SQ' },
    { text: '120/95', notation: 'dipdir', problem: /dip 95 is more than 90/, source: 'DD' },
    { text: '120/90.5', notation: 'dipdir', problem: /dip 90\.5 is more than 90/, source: 'DD' },
    { text: '120/-5', notation: 'dipdir', problem: /negative angle "-5"/, source: 'DD' },
    { text: '-10/45', notation: 'dipdir', problem: /negative angle "-10"/, source: 'DD' },
    { text: '360/45', notation: 'dipdir', problem: /dip direction 360 is 360 or more/, source: 'DD: write 000' },
    { text: '400/45', notation: 'rhr', problem: /strike 400 is 360 or more/, source: 'RHR' },
    { text: '360/45SE', notation: 'auto', problem: /strike 360 is 360 or more/, source: 'SQ' },
    { text: '120/45g', notation: 'dipdir', problem: /grads.*not accepted/, source: 'RULE: no grads' },
    { text: '120/50 gon', notation: 'dipdir', problem: /grads.*not accepted/, source: 'RULE: no grads' },
    { text: '133.3g/50g', notation: 'dipdir', problem: /grads.*not accepted/, source: 'RULE: no grads' },
    { text: '120/45 rad', notation: 'dipdir', problem: /radians.*not accepted/, source: 'RULE' },
    { text: "45°30'/20", notation: 'dipdir', problem: /minutes or seconds/, source: 'RULE: decimal degrees only' },
    { text: '120,45', notation: 'dipdir', problem: /comma/, source: 'RULE' },
    { text: '120-45', notation: 'dipdir', problem: /"-" is not a separator/, source: 'RULE' },
    { text: '120/abc', notation: 'dipdir', problem: /"abc" where the dip was expected/, source: 'RULE: non-numeric' },
    { text: 'abc', notation: 'dipdir', problem: /"abc" where the dip direction was expected/, source: 'RULE: non-numeric' },
    { text: '120', notation: 'dipdir', problem: /the dip is missing/, source: 'RULE: empty field' },
    { text: '120/', notation: 'dipdir', problem: /the dip is missing/, source: 'RULE: empty field' },
    { text: '/45', notation: 'dipdir', problem: /"\/" where the dip direction was expected/, source: 'RULE: empty field' },
    { text: '120//45', notation: 'dipdir', problem: /"\/" where the dip was expected/, source: 'RULE' },
    { text: '120/45/30', notation: 'dipdir', problem: /unexpected "\/30" after the dip/, source: 'RULE: extra junk' },
    { text: '120/45 foo', notation: 'dipdir', problem: /unexpected "foo"/, source: 'RULE: extra junk' },
    { text: '120/45 OT OT', notation: 'dipdir', problem: /unexpected "OT" after "OT"/, source: 'RULE: extra junk' },
    { text: '120/45.5.5', notation: 'dipdir', problem: /"45\.5\.5" is not a number/, source: 'RULE' },
    { text: '120/45.', notation: 'dipdir', problem: /unfinished decimal/, source: 'RULE' },
    { text: '120/45\u0007', notation: 'dipdir', problem: /unexpected character U\+0007/, source: 'RULE' },
    { text: '030/45SE', notation: 'dipdir', problem: /dip quadrant SE given, but dip direction\/dip has none/, source: 'RULE: wrong notation' },
    { text: '030/45SE', notation: 'rhr', problem: /dip quadrant SE given, but right-hand-rule/, source: 'RULE' },
    { text: '030/45', notation: 'strike-quadrant', problem: /no dip quadrant/, source: 'RULE' },
    { text: 'N30E 45SE', notation: 'strike-quadrant', problem: /strike written as a quadrant bearing/, source: 'RULE' },
    { text: '030/45SE', notation: 'quadrant', problem: /strike written as an azimuth/, source: 'RULE' },
    { text: 'N30E 45', notation: 'quadrant', problem: /no dip quadrant/, source: 'RULE' },
    { text: 'N100E 45SE', notation: 'auto', problem: /bearing angle 100 in N100E is more than 90/, source: 'QB' },
    { text: 'N30 45SE', notation: 'auto', problem: /incomplete quadrant bearing/, source: 'QB' },
    { text: 'N 30 E 45SE', notation: 'auto', problem: /incomplete quadrant bearing/, source: 'RULE: no spaces inside a bearing' },
    { text: 'E30N 45SE', notation: 'auto', problem: /"E30N"|"E" where the strike/, source: 'QB: bearings start at N or S' },
    { text: '030/45NNE', notation: 'auto', problem: /"NNE" is not a dip quadrant/, source: 'RULE' },
    { text: '120/45', notation: 'bogus' as PlaneNotation, problem: /unknown plane notation/, source: 'RULE' },
  ];
  for (const { text, notation, problem } of rows) {
    it(`parsePlane(${JSON.stringify(text)}, '${notation}') throws a NotationError matching ${problem}`, () => {
      const err = notationErrorOf(() => parsePlane(text, notation));
      expect(err.message).toMatch(problem);
      expect(err.expected.length).toBeGreaterThan(0);
      if (notation !== ('bogus' as PlaneNotation)) expect(err.value).toBe(text);
    });
  }

  it('parsePlane("030/45NE") lists the dip quadrants that would fit strike 030', () => {
    const err = notationErrorOf(() => parsePlane('030/45NE'));
    expect(err.field).toBe('dip quadrant');
    expect(err.expected).toBe('a dip quadrant across strike 030: E, SE, S for dip direction 120; N, W, NW for 300');
  });

  it('parsePlane("030/45") asks for the notation to be named', () => {
    const err = notationErrorOf(() => parsePlane('030/45'));
    expect(err.field).toBe('notation');
    expect(err.expected).toMatch(/notation named \(dipdir .*, rhr .*\)/);
  });
});

describe('Coe (ed.) 2010, Geological Field Techniques, fig. 2.6', () => {
  // Published: strike/dip 008/12E is dip direction/dip 098/12.
  it('parsePlane("008/12E") gives 098/12', () => {
    expectDeepClose(parsePlane('008/12E'), { dipDirection: 98, dip: 12 }, TOL);
  });
  it('planeFromStrikeDip(8, 12, "E") gives 098/12', () => {
    expectDeepClose(planeFromStrikeDip(8, 12, 'E'), { dipDirection: 98, dip: 12 }, TOL);
  });
  it('formatPlane(098/12, "strike-quadrant") writes 008/12SE, which reads back as 098/12', () => {
    const text = formatPlane({ dipDirection: 98, dip: 12 }, 'strike-quadrant');
    expect(text).toBe('008/12SE');
    expectDeepClose(parsePlane(text), { dipDirection: 98, dip: 12 }, TOL);
  });
});

describe('parseLine reference table', () => {
  const accepted: { text: string; notation: LineNotation; expected: Line; source: string }[] = [
    { text: '125/20', notation: 'azimuth', expected: { trend: 125, plunge: 20 }, source: 'common practice: trend/plunge' },
    { text: '125 20', notation: 'auto', expected: { trend: 125, plunge: 20 }, source: 'common practice' },
    { text: '125°/20°', notation: 'auto', expected: { trend: 125, plunge: 20 }, source: 'common practice, degree signs' },
    { text: '000/00', notation: 'azimuth', expected: { trend: 0, plunge: 0 }, source: 'RULE: horizontal keeps its trend' },
    { text: '359.9/89.9', notation: 'azimuth', expected: { trend: 359.9, plunge: 89.9 }, source: 'decimals' },
    { text: 'S55E 20', notation: 'quadrant', expected: { trend: 125, plunge: 20 }, source: 'QB: 180 - 55' },
    { text: 'N10W/35', notation: 'auto', expected: { trend: 350, plunge: 35 }, source: 'QB: 360 - 10' },
    { text: 'S55W 10', notation: 'auto', expected: { trend: 235, plunge: 10 }, source: 'QB: 180 + 55' },
    { text: 'N0E 90', notation: 'quadrant', expected: { trend: 0, plunge: 90 }, source: 'RULE: vertical keeps its trend' },
    { text: 'N90W/0', notation: 'auto', expected: { trend: 270, plunge: 0 }, source: 'QB' },
    { text: 'S0E 5', notation: 'auto', expected: { trend: 180, plunge: 5 }, source: 'QB' },
    { text: 'N0W 5', notation: 'auto', expected: { trend: 0, plunge: 5 }, source: 'QB: 360 - 0 wraps to 0' },
  ];
  for (const { text, notation, expected } of accepted) {
    it(`parseLine(${JSON.stringify(text)}, '${notation}') gives ${expected.trend}/${expected.plunge}`, () => {
      expectDeepClose(parseLine(text, notation), expected, TOL);
    });
  }

  const rejected: { text: string; notation: LineNotation; problem: RegExp; source: string }[] = [
    { text: '', notation: 'auto', problem: /empty/, source: 'RULE' },
    { text: '125/20SE', notation: 'auto', problem: /a line has no dip quadrant/, source: 'RULE' },
    { text: '125/20 OT', notation: 'auto', problem: /overturned flag "OT" on a line/, source: 'RULE' },
    { text: '125/95', notation: 'auto', problem: /plunge 95 is more than 90/, source: 'common practice: plunge 0 to 90' },
    { text: '360/10', notation: 'auto', problem: /trend 360 is 360 or more/, source: 'RULE' },
    { text: '125/-20', notation: 'auto', problem: /negative angle/, source: 'RULE' },
    { text: '125/20g', notation: 'auto', problem: /grads.*not accepted/, source: 'RULE' },
    { text: 'S95E 20', notation: 'auto', problem: /bearing angle 95 in S95E is more than 90/, source: 'QB' },
    { text: 'S55E 20', notation: 'azimuth', problem: /trend written as a quadrant bearing/, source: 'RULE' },
    { text: '125/20', notation: 'quadrant', problem: /trend written as an azimuth/, source: 'RULE' },
    { text: '125/20 x', notation: 'auto', problem: /unexpected "x" after the plunge/, source: 'RULE' },
    { text: '125', notation: 'auto', problem: /the plunge is missing/, source: 'RULE' },
  ];
  for (const { text, notation, problem } of rejected) {
    it(`parseLine(${JSON.stringify(text)}, '${notation}') throws a NotationError matching ${problem}`, () => {
      const err = notationErrorOf(() => parseLine(text, notation));
      expect(err.message).toMatch(problem);
      expect(err.value).toBe(text);
    });
  }
});

describe('single-field parsers', () => {
  // Source: QB and DD definitions above (common practice); range rules are our documented rules.
  it('parseAzimuth("030", "strike") gives 30 and parseAzimuth("30.5°") gives 30.5', () => {
    expect(parseAzimuth('030', 'strike')).toBe(30);
    expect(parseAzimuth('30.5°')).toBe(30.5);
  });
  it('parseAzimuth("S55E", "trend") reads the bearing as 125 and parseAzimuth("N30E", "strike") as 30', () => {
    expect(parseAzimuth('S55E', 'trend')).toBe(125);
    expect(parseAzimuth('N30E', 'strike')).toBe(30);
  });
  const rejected: { call: () => unknown; label: string; problem: RegExp }[] = [
    { call: () => parseAzimuth('360', 'trend'), label: 'parseAzimuth("360", "trend")', problem: /trend 360 is 360 or more/ },
    { call: () => parseAzimuth('-5', 'strike'), label: 'parseAzimuth("-5", "strike")', problem: /negative angle "-5"/ },
    { call: () => parseAzimuth('', 'strike'), label: 'parseAzimuth("", "strike")', problem: /empty; expected a strike/ },
    { call: () => parseAzimuth('30/45', 'strike'), label: 'parseAzimuth("30/45", "strike")', problem: /unexpected "\/45" after the strike/ },
    { call: () => parseAzimuth('400g', 'dip direction'), label: 'parseAzimuth("400g", "dip direction")', problem: /grads/ },
    { call: () => parseDip('91'), label: 'parseDip("91")', problem: /dip 91 is more than 90/ },
    { call: () => parseDip('45SE'), label: 'parseDip("45SE")', problem: /unexpected "SE" after the dip/ },
    { call: () => parseDip('50g'), label: 'parseDip("50g")', problem: /grads.*not accepted/ },
    { call: () => parseDip('steep'), label: 'parseDip("steep")', problem: /"steep" where the dip was expected/ },
    { call: () => parsePlunge('x'), label: 'parsePlunge("x")', problem: /"x" where the plunge was expected/ },
    { call: () => parsePlunge(''), label: 'parsePlunge("")', problem: /empty; expected a plunge from 0 to 90/ },
  ];
  for (const { call, label, problem } of rejected) {
    it(`${label} throws a NotationError matching ${problem}`, () => {
      expect(notationErrorOf(call).message).toMatch(problem);
    });
  }
  it('parseDip("90°") gives 90 and parsePlunge("0") gives 0 (both ends of the range are allowed)', () => {
    expect(parseDip('90°')).toBe(90);
    expect(parsePlunge('0')).toBe(0);
  });
});

describe('planeFromStrikeDip', () => {
  const rows: { args: [number, number, string?]; expected: PlaneMeasurement; source: string }[] = [
    { args: [30, 45], expected: { dipDirection: 120, dip: 45 }, source: 'RHR' },
    { args: [300, 20], expected: { dipDirection: 30, dip: 20 }, source: 'RHR, wraps' },
    { args: [30, 45, 'SE'], expected: { dipDirection: 120, dip: 45 }, source: 'SQ' },
    { args: [210, 45, 'SE'], expected: { dipDirection: 120, dip: 45 }, source: 'SQ' },
    { args: [30, 45, ' nw '], expected: { dipDirection: 300, dip: 45 }, source: 'SQ, case and spaces' },
  ];
  for (const { args, expected } of rows) {
    it(`planeFromStrikeDip(${args.map((a) => JSON.stringify(a)).join(', ')}) gives ${expected.dipDirection}/${expected.dip}`, () => {
      expectDeepClose(planeFromStrikeDip(...args), expected, TOL);
    });
  }
  const rejected: { args: [number, number, string?]; problem: RegExp }[] = [
    { args: [30, 45, 'NE'], problem: /NE lies along strike 30/ },
    { args: [30, 95], problem: /dip 95 is more than 90/ },
    { args: [360, 45], problem: /strike 360 is 360 or more/ },
    { args: [NaN, 45], problem: /strike NaN is not a number/ },
    { args: [30, 45, ''], problem: /empty dip quadrant/ },
    { args: [30, 45, 'X'], problem: /"X" is not a dip quadrant/ },
  ];
  for (const { args, problem } of rejected) {
    it(`planeFromStrikeDip(${args.map((a) => JSON.stringify(a)).join(', ')}) throws a NotationError matching ${problem}`, () => {
      expect(notationErrorOf(() => planeFromStrikeDip(...args)).message).toMatch(problem);
    });
  }
});

describe('formatPlane and formatLine reference table', () => {
  // Expected strings follow the documented output rules (src/core/notation.ts) over the
  // definitions DD, RHR, SQ and QB above.
  const planes: { plane: PlaneMeasurement; notation: PlaneFormat; decimals?: number; text: string }[] = [
    { plane: { dipDirection: 120, dip: 45 }, notation: 'dipdir', text: '120/45' },
    { plane: { dipDirection: 120, dip: 45 }, notation: 'rhr', text: '030/45' },
    { plane: { dipDirection: 120, dip: 45 }, notation: 'strike-quadrant', text: '030/45SE' },
    { plane: { dipDirection: 120, dip: 45 }, notation: 'quadrant', text: 'N30E 45SE' },
    { plane: { dipDirection: 300, dip: 45 }, notation: 'quadrant', text: 'N30E 45NW' },
    { plane: { dipDirection: 300, dip: 45 }, notation: 'strike-quadrant', text: '210/45NW' },
    { plane: { dipDirection: 0, dip: 30 }, notation: 'quadrant', text: 'N90E 30N' },
    { plane: { dipDirection: 90, dip: 30 }, notation: 'strike-quadrant', text: '000/30E' },
    { plane: { dipDirection: 90, dip: 30 }, notation: 'quadrant', text: 'N00E 30E' },
    { plane: { dipDirection: 5, dip: 5 }, notation: 'dipdir', text: '005/05' },
    { plane: { dipDirection: 200, dip: 0 }, notation: 'rhr', text: '110/00' },
    { plane: { dipDirection: 120, dip: 90 }, notation: 'dipdir', text: '120/90' },
    { plane: { dipDirection: 120, dip: 45, overturned: true }, notation: 'dipdir', text: '120/45 OT' },
    { plane: { dipDirection: 120, dip: 45, overturned: true }, notation: 'quadrant', text: 'N30E 45SE OT' },
    { plane: { dipDirection: 359.6, dip: 45 }, notation: 'dipdir', text: '000/45' },
    { plane: { dipDirection: 30.26, dip: 45.5 }, notation: 'dipdir', decimals: 1, text: '030.3/45.5' },
    { plane: { dipDirection: 95.5, dip: 12 }, notation: 'quadrant', decimals: 1, text: 'N05.5E 12.0SE' },
  ];
  for (const { plane, notation, decimals, text } of planes) {
    it(`formatPlane(${JSON.stringify(plane)}, '${notation}'${decimals === undefined ? '' : `, {decimals: ${decimals}}`}) writes ${text}`, () => {
      expect(formatPlane(plane, notation, decimals === undefined ? undefined : { decimals })).toBe(text);
    });
  }
  const lines: { line: Line; notation: LineFormat; text: string }[] = [
    { line: { trend: 125, plunge: 20 }, notation: 'azimuth', text: '125/20' },
    { line: { trend: 125, plunge: 20 }, notation: 'quadrant', text: 'S55E 20' },
    { line: { trend: 350, plunge: 35 }, notation: 'quadrant', text: 'N10W 35' },
    { line: { trend: 90, plunge: 0 }, notation: 'quadrant', text: 'N90E 00' },
    { line: { trend: 180, plunge: 10 }, notation: 'quadrant', text: 'S00E 10' },
    { line: { trend: 270, plunge: 5 }, notation: 'quadrant', text: 'N90W 05' },
    { line: { trend: 5, plunge: 5 }, notation: 'azimuth', text: '005/05' },
  ];
  for (const { line, notation, text } of lines) {
    it(`formatLine(${JSON.stringify(line)}, '${notation}') writes ${text}`, () => {
      expect(formatLine(line, notation)).toBe(text);
    });
  }
  it('formatPlane rejects a dip over 90 and formatLine rejects a trend of 360 with a RangeError', () => {
    expect(() => formatPlane({ dipDirection: 10, dip: 91 }, 'dipdir')).toThrow(RangeError);
    expect(() => formatLine({ trend: 360, plunge: 10 }, 'azimuth')).toThrow(RangeError);
    expect(() => formatLine({ trend: 10, plunge: 10 }, 'azimuth', { decimals: 7 })).toThrow(/decimals/);
  });
});

describe('compass helpers', () => {
  // QB definitions (common practice) and the sector rule (RULE).
  it('bearingToAzimuth and azimuthToBearing agree with the quadrant-bearing definitions', () => {
    expect(bearingToAzimuth('N', 30, 'E')).toBe(30);
    expect(bearingToAzimuth('N', 10, 'W')).toBe(350);
    expect(bearingToAzimuth('S', 55, 'E')).toBe(125);
    expect(bearingToAzimuth('S', 45, 'W')).toBe(225);
    expect(azimuthToBearing(225)).toEqual({ from: 'S', angle: 45, toward: 'W' });
    expect(azimuthToBearing(0)).toEqual({ from: 'N', angle: 0, toward: 'E' });
  });
  it('inSector closes quarters and opens halves, and pickOpposite(120, "NE") finds no side', () => {
    expect(inSector(90, 'NE')).toBe(true);
    expect(inSector(90, 'SE')).toBe(true);
    expect(inSector(0, 'E')).toBe(false);
    expect(inSector(180, 'E')).toBe(false);
    expect(pickOpposite(120, 'NW')).toBe(300);
    expect(pickOpposite(120, 'NE')).toBeUndefined();
    expect(sectorOf(98)).toBe('SE');
    expect(sectorOf(270)).toBe('W');
  });
});

describe('detectPlaneNotation', () => {
  it('detectPlaneNotation(["030/45SE", "210/30NW", ""]) finds strike-quadrant and counts the blank', () => {
    const r = detectPlaneNotation(['030/45SE', '210/30NW', '']);
    expect(r.status).toBe('single');
    expect(r.notation).toBe('strike-quadrant');
    expect(r.counts).toEqual({ bare: 0, strikeQuadrant: 2, quadrant: 0, unreadable: 0, blank: 1 });
  });
  it('detectPlaneNotation(["N30E 45SE", "S10W 20E"]) finds quadrant', () => {
    const r = detectPlaneNotation(['N30E 45SE', 'S10W 20E']);
    expect(r.status).toBe('single');
    expect(r.notation).toBe('quadrant');
  });
  it('detectPlaneNotation(["030/45SE", "N30E 45SE"]) says both are self-describing and auto reads them', () => {
    const r = detectPlaneNotation(['030/45SE', 'N30E 45SE']);
    expect(r.status).toBe('self-describing-mixed');
    expect(r.notation).toBe('auto');
  });
  it('detectPlaneNotation(["120/45", "130 40"]) says the notation must be named, and names no notation', () => {
    const r = detectPlaneNotation(['120/45', '130 40']);
    expect(r.status).toBe('needs-naming');
    expect(r.notation).toBeUndefined();
    expect(r.message).toMatch(/dip direction\/dip or right-hand-rule strike\/dip/);
  });
  it('detectPlaneNotation(["120/45", "030/45SE"]) reports a mixed column', () => {
    const r = detectPlaneNotation(['120/45', '030/45SE']);
    expect(r.status).toBe('mixed');
    expect(r.notation).toBeUndefined();
  });
  it('detectPlaneNotation lists unreadable samples by index, including letters along the strike', () => {
    const r = detectPlaneNotation(['030/45SE', 'x', '030/45NE']);
    expect(r.status).toBe('single');
    expect(r.counts.unreadable).toBe(2);
    expect(r.unreadable.map((u) => u.index)).toEqual([1, 2]);
    expect(r.unreadable[1].error.message).toMatch(/NE lies along strike 030/);
  });
  it('detectPlaneNotation([" ", ""]) is empty and detectPlaneNotation(["x"]) unreadable', () => {
    expect(detectPlaneNotation([' ', '']).status).toBe('empty');
    expect(detectPlaneNotation(['x']).status).toBe('unreadable');
  });
});

describe('tryParse* variants', () => {
  it('tryParsePlane("030/45") returns a NotationProblem with the same facts parsePlane throws', () => {
    const problem = tryParsePlane('030/45');
    expect(problem).toBeInstanceOf(NotationProblem);
    const err = notationErrorOf(() => parsePlane('030/45'));
    const p = problem as NotationProblem;
    expect([p.value, p.problem, p.expected, p.field, p.message]).toEqual([err.value, err.problem, err.expected, err.field, err.message]);
  });
  it('tryParsePlane, tryParseLine, tryParseAzimuth, tryParseDip and tryParsePlunge return values for good text', () => {
    expect(tryParsePlane('N30E 45SE')).toEqual({ dipDirection: 120, dip: 45 });
    expect(tryParseLine('S55E 20')).toEqual({ trend: 125, plunge: 20 });
    expect(tryParseAzimuth('S55E', 'trend')).toBe(125);
    expect(tryParseDip('45')).toBe(45);
    expect(tryParsePlunge('95')).toBeInstanceOf(NotationProblem);
    expect((tryParseDip('50g') as NotationProblem).message).toMatch(/grads/);
  });
});

describe('parseOverturnedFlag', () => {
  it('parseOverturnedFlag reads OT, yes and blank, and rejects "maybe"', () => {
    expect(parseOverturnedFlag('OT')).toBe(true);
    expect(parseOverturnedFlag(' yes ')).toBe(true);
    expect(parseOverturnedFlag('')).toBe(false);
    expect(parseOverturnedFlag('upright')).toBe(false);
    expect(notationErrorOf(() => parseOverturnedFlag('maybe')).message).toMatch(/"maybe" is not an overturned flag/);
  });
});

// ---- property tests -------------------------------------------------------------------

const azimuthArb = fc.double({ min: 0, max: 360, maxExcluded: true, noNaN: true });
// Dips with the edge cases 0 (horizontal) and 90 (vertical) drawn often.
const dipArb = fc.oneof(fc.constant(0), fc.constant(90), fc.double({ min: 0, max: 90, noNaN: true }));
const planeArb = fc.record({ dipDirection: azimuthArb, dip: dipArb, overturned: fc.boolean() });
const PLANE_FORMATS: PlaneFormat[] = ['dipdir', 'rhr', 'strike-quadrant', 'quadrant'];

describe('format -> parse round trips (property)', () => {
  for (const notation of PLANE_FORMATS) {
    it(`parsePlane(formatPlane(p, '${notation}', {decimals: 4}), '${notation}') returns p to 0.5e-4 for any plane`, () => {
      fc.assert(
        fc.property(planeArb, (p) => {
          const text = formatPlane(p, notation, { decimals: 4 });
          const back = parsePlane(text, notation);
          expectAzimuth(back.dipDirection, p.dipDirection, 0.5e-4 + 1e-9, `dipDirection of ${text}`);
          expectClose(back.dip, p.dip, 0.5e-4 + 1e-9, `dip of ${text}`);
          expect(back.overturned === true).toBe(p.overturned);
        }),
        { numRuns: 2000 },
      );
    });

    it(`parsePlane(formatPlane(p, '${notation}'), '${notation}') returns whole-degree planes exactly, 0 and 90 included`, () => {
      fc.assert(
        fc.property(fc.integer({ min: 0, max: 359 }), fc.integer({ min: 0, max: 90 }), (dipDirection, dip) => {
          expect(parsePlane(formatPlane({ dipDirection, dip }, notation), notation)).toEqual({ dipDirection, dip });
        }),
        { numRuns: 2000 },
      );
    });
  }

  it("parsePlane(text, 'auto') reads what formatPlane writes in strike-quadrant and quadrant notation", () => {
    fc.assert(
      fc.property(planeArb, fc.constantFrom<PlaneFormat>('strike-quadrant', 'quadrant'), (p, notation) => {
        const text = formatPlane(p, notation, { decimals: 3 });
        expectAzimuth(parsePlane(text, 'auto').dipDirection, p.dipDirection, 0.5e-3 + 1e-9, text);
      }),
    );
  });

  for (const notation of ['azimuth', 'quadrant'] as LineFormat[]) {
    it(`parseLine(formatLine(l, '${notation}', {decimals: 4}), '${notation}') returns l to 0.5e-4 for any line`, () => {
      fc.assert(
        fc.property(azimuthArb, dipArb, (trend, plunge) => {
          const text = formatLine({ trend, plunge }, notation, { decimals: 4 });
          const back = parseLine(text, notation);
          expectAzimuth(back.trend, trend, 0.5e-4 + 1e-9, `trend of ${text}`);
          expectClose(back.plunge, plunge, 0.5e-4 + 1e-9, `plunge of ${text}`);
        }),
        { numRuns: 2000 },
      );
    });
  }

  it("parsePlane(text, 'strike-quadrant') always gives strike ± 90 on the side of the written letters", () => {
    // Definition SQ: the dip direction is perpendicular to the strike, within the sector named.
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 359 }), fc.constantFrom('N', 'NE', 'E', 'SE', 'S', 'SW', 'W', 'NW'), (strike, letters) => {
        let plane: PlaneMeasurement;
        try {
          plane = parsePlane(`${strike}/30${letters}`, 'strike-quadrant');
        } catch (e) {
          // Only letters along the strike may be refused: neither strike ± 90 in the sector.
          expect(e).toBeInstanceOf(NotationError);
          expect(inSector(strike + 90, letters as 'N') || inSector(strike + 270, letters as 'N')).toBe(false);
          return;
        }
        const off = Math.abs(((plane.dipDirection - strike + 540) % 360) - 180);
        expect(off).toBe(90);
        expect(inSector(plane.dipDirection, letters as 'N')).toBe(true);
      }),
    );
  });
});

describe('parsers never throw anything but NotationError (property)', () => {
  // Strings built from the notation's own alphabet reach deep into the grammar; arbitrary
  // Unicode strings cover everything else.
  const pieces = ['0', '1', '9', '45', '090', '360', '.', '/', ' ', '\t', '°', 'º', 'N', 'E', 'S', 'W', 'SE', 'g', 'gon', '-', ',', "'", 'OT', 'from', 'x', '\u00a0'];
  const grammarish = fc.array(fc.constantFrom(...pieces), { maxLength: 12 }).map((a) => a.join(''));
  const anyText = fc.oneof(grammarish, fc.string({ unit: 'binary', maxLength: 40 }), fc.string({ maxLength: 40 }));
  const planeNotations: PlaneNotation[] = ['dipdir', 'rhr', 'strike-quadrant', 'quadrant', 'auto'];
  const lineNotations: LineNotation[] = ['azimuth', 'quadrant', 'auto'];

  /** Calls f; a result must satisfy ok, a throw must be a NotationError carrying the input. */
  function onlyNotationErrors<T>(text: string, f: () => T, ok: (v: T) => boolean): void {
    let v: T;
    try {
      v = f();
    } catch (e) {
      if (!(e instanceof NotationError)) throw new Error(`${JSON.stringify(text)} threw ${String(e)}`);
      expect(e.value).toBe(text);
      return;
    }
    expect(ok(v)).toBe(true);
  }
  const planeOk = (p: PlaneMeasurement): boolean => p.dipDirection >= 0 && p.dipDirection < 360 && p.dip >= 0 && p.dip <= 90;
  const lineOk = (l: Line): boolean => l.trend >= 0 && l.trend < 360 && l.plunge >= 0 && l.plunge <= 90;

  it('parsePlane, parseLine, parseAzimuth, parseDip and parsePlunge on arbitrary strings return in-range values or throw NotationError', () => {
    fc.assert(
      fc.property(anyText, (text) => {
        for (const n of planeNotations) onlyNotationErrors(text, () => parsePlane(text, n), planeOk);
        for (const n of lineNotations) onlyNotationErrors(text, () => parseLine(text, n), lineOk);
        onlyNotationErrors(text, () => parseAzimuth(text, 'strike'), (a) => a >= 0 && a < 360);
        onlyNotationErrors(text, () => parseDip(text), (d) => d >= 0 && d <= 90);
        onlyNotationErrors(text, () => parsePlunge(text), (d) => d >= 0 && d <= 90);
        onlyNotationErrors(text, () => parseOverturnedFlag(text), (b) => typeof b === 'boolean');
        // The try variants never throw, and agree with the throwing ones.
        const tried = tryParsePlane(text, 'auto');
        if (tried instanceof NotationProblem) expect(tried.value).toBe(text);
        else expect(parsePlane(text, 'auto')).toEqual(tried);
        const triedLine = tryParseLine(text);
        if (!(triedLine instanceof NotationProblem)) expect(parseLine(text)).toEqual(triedLine);
      }),
      { numRuns: fuzzRuns(3000) },
    );
  }, fuzzTimeout());

  it('detectPlaneNotation on arbitrary samples never throws and accounts for every sample', () => {
    fc.assert(
      fc.property(fc.array(anyText, { maxLength: 8 }), (samples) => {
        const r = detectPlaneNotation(samples);
        const c = r.counts;
        expect(c.bare + c.strikeQuadrant + c.quadrant + c.unreadable + c.blank).toBe(samples.length);
      }),
      { numRuns: fuzzRuns(100) },
    );
  }, fuzzTimeout());

  it('parsePlane on a 100 000-character string stops at the token cap with a NotationError about extra text', () => {
    const err = notationErrorOf(() => parsePlane('1 '.repeat(50_000), 'dipdir'));
    expect(err.message).toMatch(/unexpected extra text/);
    expect(err.message.length).toBeLessThan(400);
  });
});
