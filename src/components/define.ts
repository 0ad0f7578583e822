/**
 * Registers a custom element once. Hosts may load Foldlens twice (two bundles, hot reload);
 * a second `customElements.define` of the same name would throw and break their page.
 */
export function defineOnce(name: string, ctor: CustomElementConstructor): void {
  if (!customElements.get(name)) customElements.define(name, ctor);
}
