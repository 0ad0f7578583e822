/**
 * A value built on first use and kept: benchmark inputs are made once, untimed, and only for
 * the cases that run.
 * @example const poles = lazy(() => foldedPoles(1e5, 1)); poles().length
 */
export function lazy<T>(make: () => T): () => T {
  let made = false;
  let value: T;
  return () => {
    if (!made) {
      value = make();
      made = true;
    }
    return value;
  };
}
