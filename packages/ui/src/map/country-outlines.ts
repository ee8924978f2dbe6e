// The offline basemap: Natural Earth country outlines (1:50m, from world-atlas) shipped as a
// static asset and turned from TopoJSON into GeoJSON once per page load.
import { feature } from 'topojson-client';
import type { Topology, GeometryCollection } from 'topojson-specification';
import type { GeoJsonObject } from 'geojson';
import countriesUrl from 'world-atlas/countries-50m.json?url';

let cached: Promise<GeoJsonObject> | null = null;

export function loadCountryOutlines(): Promise<GeoJsonObject> {
  cached ??= fetch(countriesUrl)
    .then((res) => {
      if (!res.ok) throw new Error(`Country outlines: HTTP ${res.status}`);
      return res.json() as Promise<Topology<{ countries: GeometryCollection }>>;
    })
    .then((topology) => feature(topology, topology.objects.countries) as GeoJsonObject)
    .catch((err: unknown) => {
      cached = null;
      throw err;
    });
  return cached;
}
