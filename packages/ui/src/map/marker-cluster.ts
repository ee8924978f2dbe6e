// Marker clustering for maps that show many partners. leaflet.markercluster is a classic plugin
// that reads and extends a global `L`; it gets a mutable copy of the same ES Leaflet module that
// vue-leaflet uses (the `leaflet` alias in vite.config.ts), so Leaflet is bundled and run once.
import * as leaflet from 'leaflet';
import type { MarkerClusterGroup, MarkerClusterGroupOptions } from 'leaflet';

type Leaflet = typeof leaflet;
type ClusterFactory = (options?: MarkerClusterGroupOptions) => MarkerClusterGroup;

let ready: Promise<ClusterFactory> | null = null;

/** The plugin's `markerClusterGroup` factory, loading the plugin on first use. */
export function loadMarkerCluster(): Promise<ClusterFactory> {
  ready ??= (async () => {
    const scope = globalThis as { L?: Leaflet };
    // the module namespace object is frozen; the plugin adds its classes to this copy
    scope.L ??= { ...leaflet };
    await import('leaflet.markercluster');
    const factory = scope.L.markerClusterGroup;
    if (typeof factory !== 'function') throw new Error('Marker clustering did not load');
    return factory;
  })().catch((err: unknown) => {
    ready = null;
    throw err;
  });
  return ready;
}
