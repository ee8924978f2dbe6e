// Marker icons for vue-leaflet's LMarker `icon` prop. The maps build their icons with Leaflet's
// divIcon up front instead of vue-leaflet's LIcon component, which imports Leaflet after mounting
// and then observes its root element: when the map is re-rendered or left while that import is
// pending, the root is gone and the browser logs "Failed to execute 'observe' on
// 'MutationObserver'". The prop is typed as an image Icon although Leaflet accepts any icon.
import type { DivIcon, Icon } from 'leaflet';

export function asMarkerIcon(icon: DivIcon): Icon {
  return icon as unknown as Icon;
}
