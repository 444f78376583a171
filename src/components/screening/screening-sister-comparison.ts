// The sister-unit comparison of a screening, loaded only when the evidence part of a screening shows it (it brings the
// engine's sister statistics and the chart along).
import { defineAsyncComponent } from 'vue';

export const ScreeningSisterComparisonAsync = defineAsyncComponent(() => import('./ScreeningSisterComparison.vue'));
