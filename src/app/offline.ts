/**
 * Offline support for the built demo: registers the service worker (public/foldlens-sw.js) and
 * keeps a status line telling the user whether the demo works without network. The dev server
 * is left alone (its module graph changes on every edit).
 */
export function setUpOffline(status: HTMLElement, extraUrls: () => string[] = () => []): () => void {
  const SAVED_KEY = 'foldlens-demo-offline-saved';
  // Remembered across visits: after a reload with the network cut, the copy is still there.
  let saved = 'serviceWorker' in navigator && navigator.serviceWorker.controller !== null && localStorage.getItem(SAVED_KEY) === 'true';
  const show = () => {
    if (!navigator.onLine) status.textContent = saved ? 'Offline: working from the saved copy' : 'Offline';
    else status.textContent = saved ? 'Saved for offline use' : '';
    status.dataset.offlineReady = String(saved);
  };
  const saveEverything = () => {
    const controller = 'serviceWorker' in navigator ? navigator.serviceWorker.controller : null;
    if (!controller) return;
    // Everything this page has loaded so far, fetched again through the worker into its cache.
    const urls = [location.href, ...performance.getEntriesByType('resource').map((e) => e.name), ...extraUrls()];
    controller.postMessage({ type: 'foldlens-cache', urls: [...new Set(urls)] });
  };
  window.addEventListener('online', show);
  window.addEventListener('offline', show);
  // Not under the dev server (import.meta.hot exists only there): its modules change on every edit.
  if (!import.meta.hot && 'serviceWorker' in navigator) {
    navigator.serviceWorker.addEventListener('message', (e: MessageEvent<{ type?: string }>) => {
      if (e.data?.type !== 'foldlens-cached') return;
      saved = true;
      localStorage.setItem(SAVED_KEY, 'true');
      show();
    });
    navigator.serviceWorker.addEventListener('controllerchange', saveEverything);
    if (navigator.serviceWorker.controller) window.addEventListener('load', saveEverything);
    navigator.serviceWorker.register(`${import.meta.env.BASE_URL}foldlens-sw.js`).catch((e: unknown) => {
      status.textContent = `Offline copy unavailable (${e instanceof Error ? e.message : String(e)})`;
    });
  }
  show();
  // Call again once the page has loaded everything it needs (map tiles, workers, data).
  return saveEverything;
}
