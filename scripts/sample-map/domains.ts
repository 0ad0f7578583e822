/**
 * The two structural domains and the fault between them, ready for evaluation.
 */
import { CONTACT_LEVELS, DOMAINS, FAULT, FRAME_HEIGHT, FRAME_WIDTH } from './district';
import { profileCurve, stratHeight, type FoldDomain } from './fold';
import type { XY } from './contours';

/**
 * Stratigraphic height at each domain's origin: ties the successions of the two domains.
 * @example LEVEL_AT_ORIGIN.east // 250
 */
export const LEVEL_AT_ORIGIN: Readonly<Record<'west' | 'east', number>> = { west: 0, east: 250 };

/**
 * The domains with their offsets: offset = F(origin) + h(0), so F at the origin equals
 * LEVEL_AT_ORIGIN. The Kell Fault therefore has an east-side-up throw of several hundred metres.
 * @example buildDomains()[0].offset
 */
export function buildDomains(): FoldDomain[] {
  return DOMAINS.map((d) => ({ ...d, offset: LEVEL_AT_ORIGIN[d.id] + profileCurve(d, 0).h }));
}

const [ax, ay] = FAULT.trace.from;
const [bx, by] = FAULT.trace.to;
const faultLength = Math.hypot(bx - ax, by - ay);

/**
 * Signed distance in metres from the Kell Fault trace: positive on the west side.
 * @example faultSide(0, 2000) > 0 // true
 */
export function faultSide(x: number, y: number): number {
  // z-component of (B - A) x (P - A): positive to the left of A -> B, which runs north.
  return ((bx - ax) * (y - ay) - (by - ay) * (x - ax)) / faultLength;
}

/**
 * The domain that holds local point (x, y).
 * @example domainAt(buildDomains(), 500, 500).id // 'west'
 */
export function domainAt(domains: readonly FoldDomain[], x: number, y: number): FoldDomain {
  return faultSide(x, y) >= 0 ? domains[0] : domains[1];
}

/**
 * Domain polygons in local metres (closed rings, counter-clockwise).
 * @example DOMAIN_RINGS.west[1] // [3150, 0], where the fault leaves the south edge
 */
export const DOMAIN_RINGS: Readonly<Record<'west' | 'east', readonly XY[]>> = {
  west: [[0, 0], [ax, ay], [bx, by], [0, FRAME_HEIGHT], [0, 0]],
  east: [[ax, ay], [FRAME_WIDTH, 0], [FRAME_WIDTH, FRAME_HEIGHT], [bx, by], [ax, ay]],
};

/**
 * Index of the unit at stratigraphic height F: 0 = oldest; the number of contacts at or below F.
 * @example unitIndexAt(stratHeight(domain, x, y, z))
 */
export function unitIndexAt(f: number): number {
  return CONTACT_LEVELS.filter((c) => c <= f).length;
}

/**
 * The unit index at local point (x, y, z).
 * @example UNITS[unitAt(domains, 500, 500, 720)].code
 */
export function unitAt(domains: readonly FoldDomain[], x: number, y: number, z: number): number {
  return unitIndexAt(stratHeight(domainAt(domains, x, y), x, y, z));
}
