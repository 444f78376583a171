// The event and unit files' click-to-open forms, loaded when first opened: they bring the form schemas (zod), the
// readings CSV parser and the plausibility checks, which a first visit does not need.
import { defineAsyncComponent } from 'vue';

export const EventSessionFormAsync = defineAsyncComponent(() => import('./EventSessionForm.vue'));
export const EventSessionCorrectFormAsync = defineAsyncComponent(() => import('./EventSessionCorrectForm.vue'));
export const EventSweepUploadAsync = defineAsyncComponent(() => import('./EventSweepUpload.vue'));
export const EventReadingsImportAsync = defineAsyncComponent(() => import('./EventReadingsImport.vue'));
export const EventFaultCorrectFormAsync = defineAsyncComponent(() => import('./EventFaultCorrectForm.vue'));
