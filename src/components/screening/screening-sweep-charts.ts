// The sweep and dissipation-over-frequency evidence charts, loaded only when the evidence part of a screening shows them.
import { defineAsyncComponent } from 'vue';

export const ScreeningSweepChartsAsync = defineAsyncComponent(() => import('./ScreeningSweepCharts.vue'));
