// The findings card: photos shown as thumbnails from blob URLs fetched with the token, PDFs as named files; an
// engineer adds a file to a finding (multipart `file`) and the card asks for a refresh; a refused file is said.
import { mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { afterEach, describe, expect, it, vi } from 'vitest';
import EventFindings from '../../../src/components/event/EventFindings.vue';
import type { EventFinding } from '../../../src/api/findings';
import { quasarOptions } from '../../../src/quasar-options';
import { acceptAttribute, UPLOAD_TYPES } from '../../../shared/uploads/file-types';
import { captureDownloads, resetClientState, scriptFetch, settle, storeToken } from '../helpers';

const photo = { id: 5, name: 'winding.png', contentType: 'image/png', kind: 'png', size: 2048, sha256: 'a'.repeat(64), createdAt: '2026-12-01T10:00:00.000Z' };
const report = { id: 6, name: 'inspection.pdf', contentType: 'application/pdf', kind: 'pdf', size: 4096, sha256: 'b'.repeat(64), createdAt: '2026-12-01T10:05:00.000Z' };
const finding = (attachments: EventFinding['attachments']): EventFinding => ({
  id: 40,
  classification: 'no-damage',
  text: 'Windings seen through the cover.',
  recordedById: 3,
  recordedAt: '2026-12-01T09:00:00.000Z',
  attachments,
});

function render(findings: EventFinding[], canRecord = true) {
  return mount(EventFindings, {
    props: { eventId: 7, findings, zone: 'Europe/London', canRecord, personName: () => 'Ann Engineer' },
    global: { plugins: [[Quasar, quasarOptions]] },
    attachTo: document.body,
  });
}

describe('EventFindings', () => {
  afterEach(() => {
    vi.restoreAllMocks();
    resetClientState();
  });

  it('shows a photo from a blob URL fetched with the token, and a PDF by name without fetching it', async () => {
    storeToken('t0ken');
    const { blobs } = captureDownloads();
    const { requests } = scriptFetch({ 'GET /api/findings/40/attachments/5': { status: 200, body: 'png-bytes' } });
    const wrapper = render([finding([photo, report])]);
    await settle();
    expect(requests.map((r) => r.url)).toEqual(['/api/findings/40/attachments/5']);
    expect(requests[0].headers.authorization).toBe('Bearer t0ken');
    expect(blobs).toHaveLength(1);
    expect(wrapper.get('[data-test="finding-thumb"]').attributes('src')).toBe('blob:download');
    const files = wrapper.findAll('[data-test="finding-file"]');
    expect(files.map((f) => f.attributes('data-kind'))).toEqual(['png', 'pdf']);
    expect(files[1].text()).toContain('inspection.pdf');
    expect(files[1].text()).toContain('PDF');
  });

  it('uploads a picked file as multipart `file` to the finding and asks for a refresh', async () => {
    const { requests } = scriptFetch({ 'POST /api/findings/40/attachments': { status: 201, body: { ...report, id: 9 } } });
    const wrapper = render([finding([])]);
    const input = wrapper.get('[data-test="finding-file-input"]').element as HTMLInputElement;
    const file = new File(['%PDF-1.7'], 'inspection.pdf', { type: 'application/pdf' });
    Object.defineProperty(input, 'files', { value: [file], configurable: true });
    input.dispatchEvent(new Event('change'));
    await settle();
    expect(requests.map((r) => `${r.method} ${r.url}`)).toEqual(['POST /api/findings/40/attachments']);
    expect(((requests[0].body as FormData).get('file') as File).name).toBe('inspection.pdf');
    expect(wrapper.emitted('changed')).toHaveLength(1);
  });

  it('emits no refresh when the server refuses the file (415)', async () => {
    scriptFetch({
      'POST /api/findings/40/attachments': { status: 415, body: { error: { code: 'unsupported_file_type', message: 'this file is text' } } },
    });
    const wrapper = render([finding([])]);
    const input = wrapper.get('[data-test="finding-file-input"]').element as HTMLInputElement;
    Object.defineProperty(input, 'files', { value: [new File(['hello'], 'photo.jpg')], configurable: true });
    input.dispatchEvent(new Event('change'));
    await settle();
    expect(wrapper.emitted('changed')).toBeUndefined();
  });

  it('offers no file picker to someone who may not record findings', () => {
    const wrapper = render([finding([])], false);
    expect(wrapper.find('[data-test="finding-file-input"]').exists()).toBe(false);
  });

  it('filters the picker by the photo and PDF types and names a .heic photo at once, sending nothing', async () => {
    const { requests } = scriptFetch({});
    const wrapper = render([finding([])]);
    const input = wrapper.get('[data-test="finding-file-input"]').element as HTMLInputElement;
    expect(input.accept).toBe(acceptAttribute(UPLOAD_TYPES.findingFile));
    expect(wrapper.text()).toContain('JPEG (.jpg, .jpeg), PNG (.png), WebP (.webp) or PDF (.pdf); 10 MB at most');
    Object.defineProperty(input, 'files', { value: [new File(['x'], 'bushing.heic', { type: 'image/heic' })], configurable: true });
    input.dispatchEvent(new Event('change'));
    await settle();
    expect(requests).toHaveLength(0);
    expect(wrapper.get('[data-test="finding-file-error-40"]').text()).toBe(
      'bushing.heic is not a photo or PDF: pick a JPEG (.jpg, .jpeg), PNG (.png), WebP (.webp) or PDF (.pdf) file.',
    );
  });

  it('shows the server’s refusal beside the finding’s picker, as the server words it', async () => {
    const message = 'photos and documents must be JPEG, PNG, WebP or PDF files: this file is text';
    scriptFetch({ 'POST /api/findings/40/attachments': { status: 415, body: { error: { code: 'unsupported_file_type', message, fields: { file: message } } } } });
    const wrapper = render([finding([])]);
    const input = wrapper.get('[data-test="finding-file-input"]').element as HTMLInputElement;
    Object.defineProperty(input, 'files', { value: [new File(['hello'], 'photo.jpg')], configurable: true });
    input.dispatchEvent(new Event('change'));
    await vi.waitFor(() => expect(wrapper.find('[data-test="finding-file-error-40"]').exists()).toBe(true));
    expect(wrapper.get('[data-test="finding-file-error-40"]').text()).toBe(`photo.jpg was not added: ${message}`);
  });

  it('asks before a closed tab loses a half-typed finding, and not once it is recorded', async () => {
    scriptFetch({ 'POST /api/events/7/findings': { status: 201, body: { id: 41 } } });
    const wrapper = render([]);
    const quiet = new Event('beforeunload', { cancelable: true });
    window.dispatchEvent(quiet);
    expect(quiet.defaultPrevented).toBe(false);

    await wrapper.get('textarea[data-test="finding-text"]').setValue('Tank wall bulge on the LV side.');
    const dirty = new Event('beforeunload', { cancelable: true });
    window.dispatchEvent(dirty);
    expect(dirty.defaultPrevented).toBe(true);

    await wrapper.get('[data-test="finding-other"]').trigger('click');
    await wrapper.get('[data-test="finding-form"]').trigger('submit');
    await vi.waitFor(() => expect(wrapper.emitted('changed')).toHaveLength(1));
    const after = new Event('beforeunload', { cancelable: true });
    window.dispatchEvent(after);
    expect(after.defaultPrevented).toBe(false);
    wrapper.unmount();
  });
});
