import { describe, expect, it } from 'vitest';
import { mappingMemory, SAVED_MAPPINGS_KEY, type SavedMapping } from '../../src/components/import/savedMappings';

function memoryStorage(): Pick<Storage, 'getItem' | 'setItem'> & { data: Map<string, string> } {
  const data = new Map<string, string>();
  return { data, getItem: (k) => data.get(k) ?? null, setItem: (k, v) => void data.set(k, v) };
}

const entry = (headers: string[], fileName = 'a.csv'): SavedMapping => ({
  headers,
  mapping: { id: headers[0], dip: headers[1] },
  options: { planeNotation: 'auto', lineNotation: 'auto', north: 'grid', crs: 'EPSG:32633' },
  fileName,
  savedAt: '2025-06-01T00:00:00.000Z',
});

describe('mappingMemory', () => {
  it('mappingMemory(storage).find(headers) gives back the mapping saved for exactly those headers', () => {
    const memory = mappingMemory(memoryStorage());
    memory.save(entry(['Stn', 'Dip', 'E']));
    expect(memory.find(['Stn', 'Dip', 'E'])?.options.crs).toBe('EPSG:32633');
    expect(memory.find(['Dip', 'Stn', 'E'])).toBeUndefined();
    expect(memory.find(['Stn', 'Dip'])).toBeUndefined();
  });

  it('mappingMemory(storage).save(entry) replaces an older entry for the same headers and keeps at most max entries', () => {
    const storage = memoryStorage();
    const memory = mappingMemory(storage, SAVED_MAPPINGS_KEY, 3);
    memory.save(entry(['a', 'b'], 'first.csv'));
    memory.save(entry(['a', 'b'], 'second.csv'));
    expect(memory.find(['a', 'b'])?.fileName).toBe('second.csv');
    for (const h of ['c', 'd', 'e']) memory.save(entry([h, 'x']));
    expect(JSON.parse(storage.data.get(SAVED_MAPPINGS_KEY)!).length).toBe(3);
    expect(memory.find(['a', 'b'])).toBeUndefined();
  });

  it('mappingMemory(storage) passes over stored entries that no longer read as a mapping, and unreadable storage', () => {
    const storage = memoryStorage();
    storage.data.set(SAVED_MAPPINGS_KEY, JSON.stringify([{ ...entry(['a', 'b']), mapping: { azimuth: 'a' } }, entry(['c', 'd'])]));
    expect(mappingMemory(storage).find(['a', 'b'])).toBeUndefined();
    expect(mappingMemory(storage).find(['c', 'd'])).toBeDefined();
    storage.data.set(SAVED_MAPPINGS_KEY, '{not json');
    expect(mappingMemory(storage).find(['c', 'd'])).toBeUndefined();
  });

  it('mappingMemory(undefined) remembers in memory where there is no storage', () => {
    const memory = mappingMemory(undefined);
    memory.save(entry(['a', 'b']));
    expect(memory.find(['a', 'b'])).toBeDefined();
    memory.forget(['a', 'b']);
    expect(memory.find(['a', 'b'])).toBeUndefined();
  });
});
