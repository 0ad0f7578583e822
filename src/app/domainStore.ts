import type { Domain } from '../core/domain';

const KEY = 'foldlens-demo-domains-v1';

/** Loads the demo's saved domains; a damaged entry is reported and ignored, never half-read. */
export function loadDomains(): Domain[] {
  const text = localStorage.getItem(KEY);
  if (!text) return [];
  try {
    const value = JSON.parse(text) as unknown;
    if (!Array.isArray(value)) throw new Error('not a list');
    return value.filter((d): d is Domain => typeof d?.id === 'string' && typeof d?.name === 'string' && Array.isArray(d?.ring));
  } catch (e) {
    console.warn(`Saved domains could not be read (${e instanceof Error ? e.message : String(e)}); starting without them.`);
    return [];
  }
}

export function saveDomains(domains: readonly Domain[]): void {
  localStorage.setItem(KEY, JSON.stringify(domains));
}
