// The shared maps, loaded only on the pages that show them: Leaflet, the clustering plugin and
// the country outlines stay out of the first load and out of every other chunk.
import { defineAsyncComponent, h } from 'vue';
import { Skeleton } from 'ant-design-vue';

const loadingComponent = { render: () => h(Skeleton.Image, { active: true, class: 'map-loading' }) };

export const ResultsMap = defineAsyncComponent({ loader: () => import('@emberline/ui/results-map'), loadingComponent, delay: 100 });

export const AreaMap = defineAsyncComponent({ loader: () => import('@emberline/ui/area-map'), loadingComponent, delay: 100 });
