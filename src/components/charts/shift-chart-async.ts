// The shift chart of a screening, loaded only when the evidence part of a screening shows it (it brings the engine's
// reactance category and the chart along).
import { defineAsyncComponent } from 'vue';

export const ShiftChartAsync = defineAsyncComponent(() => import('./ShiftChart.vue'));
