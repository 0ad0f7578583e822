/**
 * Finds NaN and ±Infinity anywhere in a result: numbers, arrays, typed arrays, plain objects,
 * Maps and Sets, to any depth. For the fuzz properties' "no NaN or Infinity in any result".
 */

/** Options of {@link nonFiniteNumbers}. */
export interface NonFiniteOptions {
  /** Paths (as written in the returned list) where NaN is documented, e.g. "heights". */
  readonly allowNaNAt?: (path: string) => boolean;
}

/**
 * Paths of every number in `value` that is NaN or infinite, e.g. ["axis.trend", "poles[4]"].
 * @example nonFiniteNumbers({ a: [1, NaN] }) // ['a[1]']
 */
export function nonFiniteNumbers(value: unknown, options: NonFiniteOptions = {}, path = ''): string[] {
  const out: string[] = [];
  const seen = new Set<unknown>();
  const visit = (v: unknown, p: string): void => {
    if (typeof v === 'number') {
      if (!Number.isFinite(v) && !(Number.isNaN(v) && options.allowNaNAt?.(p))) out.push(p || '(value)');
      return;
    }
    if (v === null || typeof v !== 'object' || seen.has(v)) return;
    seen.add(v);
    if (ArrayBuffer.isView(v) && !(v instanceof DataView)) {
      const a = v as unknown as ArrayLike<number | bigint>;
      for (let i = 0; i < a.length; i++) if (typeof a[i] === 'number') visit(a[i], `${p}[${i}]`);
      return;
    }
    if (Array.isArray(v)) {
      v.forEach((x, i) => visit(x, `${p}[${i}]`));
      return;
    }
    if (v instanceof Map) {
      for (const [k, x] of v) visit(x, `${p}.get(${String(k)})`);
      return;
    }
    if (v instanceof Set) {
      let i = 0;
      for (const x of v) visit(x, `${p}{${i++}}`);
      return;
    }
    if (v instanceof Date) {
      if (Number.isNaN(v.getTime())) out.push(`${p} (an invalid Date)`);
      return;
    }
    for (const [k, x] of Object.entries(v)) visit(x, p ? `${p}.${k}` : k);
  };
  visit(value, path);
  return out;
}
