/**
 * Orientation notations: reading and writing planes, lines and rakes as geologists write them.
 *
 * Accepted grammar (letters are case-insensitive; "ws" is spaces, tabs or no-break spaces):
 *
 * ```text
 * plane          = direction sep dip [ws] [dip-quadrant] [[ws] overturned]
 * line           = direction sep plunge
 * rake           = angle [ [ws] ["from" ws] compass ]       (angle 0 to 180)
 * direction      = azimuth | bearing
 * azimuth        = number ["°"]                              (0 <= azimuth < 360)
 * bearing        = ("N" | "S") number ["°"] ("E" | "W")      (angle 0 to 90, no spaces inside)
 * dip, plunge    = number ["°"]                              (0 to 90)
 * dip-quadrant   = compass
 * compass        = "N" | "NE" | "E" | "SE" | "S" | "SW" | "W" | "NW"
 * overturned     = "OT" | "overturned"
 * sep            = [ws] "/" [ws] | ws
 * number         = digit {digit} ["." digit {digit}]
 * ```
 * Leading and trailing whitespace is ignored; "º" is read as "°".
 *
 * Plane notations (`PlaneNotation`) and what the first value means:
 * | notation          | example                | reads as                   |
 * |-------------------|------------------------|----------------------------|
 * | `dipdir`          | `120/45`, `120 45°`    | dip direction 120, dip 45  |
 * | `rhr`             | `030/45`               | strike 030, dip direction = strike + 90 (right-hand rule, common practice) |
 * | `strike-quadrant` | `030/45SE`, `210/45SE` | strike, dip, dip quadrant: dip direction 120 |
 * | `quadrant`        | `N30E 45SE`, `S45W/60NW` | bearing strike, dip, dip quadrant |
 * | `auto`            | `030/45SE`, `N30E 45SE` | only forms that name their dip side |
 * In `dipdir` and `rhr` the first value may also be a bearing (`S60E/45` is dip direction 120).
 * Each named notation accepts only its own form, so a column named wrongly fails loudly.
 *
 * Dip quadrants: two letters name a closed quarter (NE = 000 to 090 inclusive), one letter an
 * open half (E = more than 000 and less than 180). Of the two dip directions of a strike
 * (strike ± 90) the one in the named sector is taken. Letters that contain neither lie along
 * the strike and are rejected: `030/45NE` (NE holds the strike 030 itself) and `090/30E`.
 * `030/45SE`, `030/45E`, `030/45S` all give 120; `030/45NW`, `N`, `W` give 300.
 *
 * Rejected, each with a NotationError naming the problem (nothing is ever guessed or altered):
 * empty text; non-numbers; negative angles; azimuths of 360 or more (write `000`); dips,
 * plunges or bearing angles over 90; grads (`45g`, `50 gon`), radians, minutes and seconds;
 * commas; "-" between fields; a bare `030/45` in `auto` (dip direction/dip or right-hand-rule
 * strike/dip?); a dip quadrant in `dipdir`/`rhr` or none in `strike-quadrant`/`quadrant`;
 * letters along the strike; compass letters or `OT` after a line; any extra text.
 *
 * Horizontal and vertical: a horizontal plane (dip 0) has no true dip direction, a vertical
 * one (dip 90) two; both keep the dip direction as written (`120/00`, `120/90`, `030/90SE`),
 * and the formatters write the dip direction the value carries, so a round trip is exact.
 * A horizontal or vertical line keeps its written trend. Overturned beds are carried as
 * `overturned: true` on the PlaneMeasurement and written as a trailing ` OT`.
 *
 * Errors: the `parse*` functions throw NotationError. For bulk imports, `tryParse*` return a
 * NotationProblem (same fields, no stack trace, far cheaper) instead of throwing.
 *
 * Formatting (`formatPlane`, `formatLine`): azimuths with three integer digits (`030`), dips,
 * plunges and bearing angles with two (`05`, `N05E`), `decimals` 0 to 6 (default 0). Strike
 * notations write the right-hand-rule strike; quadrant notation writes the north end of the
 * strike (`N30E`, `N60W`, east-west as `N90E`). Dip quadrants are written as the quarter
 * holding the dip direction (`008/12SE` for 098/12), or one letter when it is due N, E, S or W.
 *
 * @example parsePlane('030/45SE') // {dipDirection: 120, dip: 45}
 * @example formatPlane({dipDirection: 120, dip: 45}, 'quadrant') // 'N30E 45SE'
 * @packageDocumentation
 */
export { NotationError, NotationProblem, messageAzimuth, quoteValue } from './notation/error';
export { COMPASS_POINTS, azimuthToBearing, bearingToAzimuth, compassCentre, inSector, isCompassPoint, pickOpposite, sectorOf } from './notation/compass';
export type { CompassPoint, QuadrantBearing } from './notation/compass';
export { parseAzimuth, parseDip, parsePlunge, tryParseAzimuth, tryParseDip, tryParsePlunge } from './notation/fields';
export { PLANE_NOTATIONS, parsePlane, parseOverturnedFlag, planeFromStrikeDip, tryParsePlane } from './notation/plane';
export type { PlaneNotation } from './notation/plane';
export { LINE_NOTATIONS, parseLine, tryParseLine } from './notation/line';
export type { LineNotation } from './notation/line';
export { formatLine, formatPlane } from './notation/format';
export type { FormatOptions, LineFormat, PlaneFormat } from './notation/format';
export { detectPlaneNotation } from './notation/detect';
export type { PlaneNotationReport, PlaneNotationStatus } from './notation/detect';
export { formatRake, parseRake, tryParseRake } from './notation/rakeText';
export type { Rake, RakeFrom } from './notation/rakeText';
