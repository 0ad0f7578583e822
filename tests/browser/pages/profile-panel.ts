// Test-only page: <foldlens-profile> alone, fed with the SYNTHETIC Korvane sample map (stations
// read through the demo's CSV path, contacts and faults from sample-maps, the DEM read from
// demUrl with src/io/dem.ts) and prepared with buildProfileData. The page acts as the host.
import type { Feature, FeatureCollection, LineString } from 'geojson';
import '../../../src/components/foldlens-profile';
import type { FoldlensProfile } from '../../../src/components/foldlens-profile';
import { buildProfileData, type ProfileData, type ProfileDataInput } from '../../../src/map/profileData';
import { readDem } from '../../../src/io/dem';
import type { Dem } from '../../../src/io/demSampler';
import { builtInCrs, toLonLat } from '../../../src/io/crs';
import { createRandom } from '../../../src/core/random';
import type { Station } from '../../../src/core/station';
import { loadSampleStations } from '../../../src/app/sampleStations';
import { contacts, demUrl, faults, truth } from '../../../sample-maps/korvane/index';

export type CaseName = 'west' | 'west-off' | 'section' | 'xss' | 'big' | 'empty';

/** Data text that must stay text (label and a contact name). */
const XSS = '<img src=x onerror=alert(1)>';

const el = document.createElement('foldlens-profile') as FoldlensProfile;
document.body.append(el);
const events: { type: string; detail: unknown }[] = [];
for (const type of ['foldlens-profile-hover', 'foldlens-profile-pick', 'foldlens-profile-options']) {
  document.addEventListener(type, (e) => events.push({ type, detail: (e as CustomEvent).detail }));
}

const west = truth.domains.find((d) => d.id === 'west')!;
const utm = builtInCrs(truth.crs.epsg)!;
const stations = loadSampleStations();
let dem: Dem | null = null;

async function korvaneDem(): Promise<Dem> {
  dem ??= await readDem(await (await fetch(demUrl)).arrayBuffer(), { source: 'dem.tif' });
  return dem;
}

/** A section across the west domain at 150°, through its profile origin, 3.8 km long (UTM metres to lon/lat with proj4). */
function westSection(): [number, number][] {
  const [e0, n0] = west.profile.originUtm;
  const az = (150 * Math.PI) / 180;
  return [-1900, 1900].map((s) => {
    const ll = toLonLat(e0 + s * Math.sin(az), n0 + s * Math.cos(az), utm);
    return [ll.lon, ll.lat] as [number, number];
  });
}

/** 10^5 bedding stations and 1000 lines of 1000 vertices over the west domain, heights given. */
function bigInput(): Pick<ProfileDataInput, 'stations' | 'contacts'> {
  const rng = createRandom(5);
  const [w, s, e, n] = [14.971, 24.604, 14.997, 24.638];
  const big: Station[] = Array.from({ length: 100_000 }, (_, i) => ({
    id: `B-${i}`,
    row: i + 1,
    kind: 'bedding',
    lon: w + (e - w) * rng.next(),
    lat: s + (n - s) * rng.next(),
    elevation: 700 + 200 * rng.next(),
    plane: { dipDirection: 360 * rng.next(), dip: 80 * rng.next() },
    source: {},
    problems: [],
  }));
  const features: Feature<LineString>[] = Array.from({ length: 1000 }, (_, f) => {
    const lat0 = s + ((n - s) * f) / 1000;
    return {
      type: 'Feature',
      properties: { name: `Form line ${f % 5}` },
      geometry: { type: 'LineString', coordinates: Array.from({ length: 1000 }, (_, v) => [w + ((e - w) * v) / 999, lat0 + 0.0004 * Math.sin(v / 40), 750 + 50 * Math.sin(v / 70 + f)]) },
    };
  });
  return { stations: big, contacts: { type: 'FeatureCollection', features } };
}

/** Loads a case into the panel and waits until it is drawn; returns what a test needs. */
async function load(name: CaseName, options: { colourBy?: 'layer' | 'distance'; verticalExaggeration?: number } = {}) {
  const t0 = performance.now();
  let data: ProfileData;
  const ring = west.polygon as [number, number][];
  if (name === 'big') {
    data = buildProfileData({ ...bigInput(), axis: west.axis, ring, label: '10^5 stations, 10^6 vertices' });
  } else if (name === 'empty') {
    data = buildProfileData({ stations: [], axis: west.axis, ring, label: 'Nothing here' });
  } else {
    const d = await korvaneDem();
    const axis = name === 'west-off' ? { trend: west.axis.trend + 5, plunge: west.axis.plunge } : west.axis;
    let contactLines: FeatureCollection = contacts;
    if (name === 'xss') {
      const first = contacts.features.find((f) => f.properties?.domain === 'west')!;
      contactLines = { type: 'FeatureCollection', features: [...contacts.features, { ...first, properties: { ...first.properties, name: `Contact ${XSS}` } }] };
    }
    data = buildProfileData({
      stations,
      contacts: contactLines,
      faults,
      dem: d,
      axis,
      ring,
      ...(name === 'section' && { section: { line: westSection(), swath: 400 } }),
      label: name === 'xss' ? `West domain ${XSS}` : west.name,
    });
  }
  const built = performance.now();
  Object.assign(el, { data, colourBy: options.colourBy ?? 'layer', verticalExaggeration: options.verticalExaggeration ?? 1, highlight: -1, label: '' });
  await el.updateComplete;
  const drawn = performance.now();
  await new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r)));
  const painted = performance.now();
  const contact = data.lines.find((l) => l.name === 'Vardel Limestone / Quennet Sandstone contact');
  const contactXY: number[] = [];
  if (contact) for (let k = 0; k < contact.xyd.length; k += 3) contactXY.push(contact.xyd[k], contact.xyd[k + 1]);
  return {
    mode: data.mode,
    counts: data.counts,
    stations: data.stations.index.length,
    noHeight: data.noHeight.length,
    contactXY,
    layers: data.lines.map((l) => l.name),
    buildMs: built - t0,
    updateMs: drawn - built,
    paintMs: painted - built,
  };
}

Object.assign(window, { profilePanel: { el, events, load, XSS } });
document.body.setAttribute('data-ready', 'true');
