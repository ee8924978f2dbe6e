// The shared area map, loaded only on the pages that show it (Leaflet and the country outlines
// stay out of every other chunk).
import { defineAsyncComponent, h } from 'vue';
import { Skeleton } from 'ant-design-vue';

export const AreaMap = defineAsyncComponent({
  loader: () => import('@emberline/ui/area-map'),
  loadingComponent: { render: () => h(Skeleton.Image, { active: true, class: 'area-map-loading' }) },
  delay: 100,
});
