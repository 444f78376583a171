import { enableAutoUnmount, type VueWrapper } from '@vue/test-utils';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken } from '../helpers';
import { eventDetail, unitDetail } from './fixtures';

enableAutoUnmount(afterEach);

// Signed in as protection user `id` (the draft key names the user).
function signedInAs(id: number) {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: makeUser({ id, roles: ['protection'], name: 'Dara Whitcombe' }) },
    'GET /api/health': { body: healthy },
    'GET /api/units/3': { body: unitDetail() },
    'GET /api/units': { body: { items: [], total: 0 } },
    'POST /api/events': { status: 201, body: { id: 11 } },
    'GET /api/events/11': { body: eventDetail() },
  });
}

async function type(wrapper: VueWrapper, testId: string, value: string): Promise<void> {
  const field = wrapper.find(`input[data-test="${testId}"]`).exists() ? wrapper.get(`input[data-test="${testId}"]`) : wrapper.get(`textarea[data-test="${testId}"]`);
  await field.setValue(value);
  await settle();
}

const inputValue = (wrapper: VueWrapper, testId: string) => (wrapper.get(`input[data-test="${testId}"]`).element as HTMLInputElement).value;
const notesValue = (wrapper: VueWrapper) => (wrapper.get('textarea[data-test="notes"]').element as HTMLTextAreaElement).value;

// What a half-typed fault leaves in the form.
async function typeHalfAFault(wrapper: VueWrapper): Promise<void> {
  await type(wrapper, 'occurred-at', '2026-07-01T04:12');
  await wrapper.get('[data-test="side-lv"]').trigger('click');
  await type(wrapper, 'shot-current-0', '6.3');
  await type(wrapper, 'shot-duration-0', '0.12');
  await type(wrapper, 'notes', 'Relay record from bay 4, recloser locked out');
}

describe('EventNewPage drafts and unsaved changes', () => {
  afterEach(() => {
    vi.restoreAllMocks();
    resetClientState();
  });

  it('puts a half-typed fault back after the page is opened again by the same user, with a notice to discard it', async () => {
    signedInAs(7);
    const first = await mountApp('/events/new?unitId=3');
    await typeHalfAFault(first.wrapper);
    expect(localStorage.getItem('gapsight.draft.fault-new.u7')).toContain('recloser locked out');
    first.wrapper.unmount();

    signedInAs(7);
    const { wrapper } = await mountApp('/events/new');
    expect(wrapper.get('[data-test="draft-notice"]').text()).toContain('Draft restored from');
    expect(inputValue(wrapper, 'shot-current-0')).toBe('6.3');
    expect(inputValue(wrapper, 'shot-duration-0')).toBe('0.12');
    expect(inputValue(wrapper, 'occurred-at')).toBe('2026-07-01T04:12');
    expect(notesValue(wrapper)).toBe('Relay record from bay 4, recloser locked out');
    expect(wrapper.get('[data-test="side-lv"]').attributes('aria-checked')).toBe('true');

    await wrapper.get('[data-test="draft-discard"]').trigger('click');
    await settle();
    expect(inputValue(wrapper, 'shot-current-0')).toBe('');
    expect(notesValue(wrapper)).toBe('');
    expect(wrapper.find('[data-test="draft-notice"]').exists()).toBe(false);
    expect(localStorage.getItem('gapsight.draft.fault-new.u7')).toBeNull();
  });

  it('does not show one user’s draft to another user of the same browser', async () => {
    signedInAs(7);
    const first = await mountApp('/events/new?unitId=3');
    await typeHalfAFault(first.wrapper);
    first.wrapper.unmount();

    signedInAs(8);
    const { wrapper } = await mountApp('/events/new');
    expect(wrapper.find('[data-test="draft-notice"]').exists()).toBe(false);
    expect(inputValue(wrapper, 'shot-current-0')).toBe('');
    expect(notesValue(wrapper)).toBe('');
  });

  it('forgets the draft once the fault is logged, and leaves for the event file without asking', async () => {
    const confirm = vi.fn(() => false);
    vi.stubGlobal('confirm', confirm);
    signedInAs(7);
    const { wrapper, router } = await mountApp('/events/new?unitId=3');
    await typeHalfAFault(wrapper);
    await wrapper.get('[data-test="type-phase-to-ground"]').trigger('click');
    await wrapper.get('[data-test="event-form"]').trigger('submit');
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('event-file'));
    expect(confirm).not.toHaveBeenCalled();
    expect(localStorage.getItem('gapsight.draft.fault-new.u7')).toBeNull();
  });

  it('asks before another page replaces typed work, and stays when the answer is no', async () => {
    const confirm = vi.fn(() => false);
    vi.stubGlobal('confirm', confirm);
    signedInAs(7);
    const { wrapper, router } = await mountApp('/events/new?unitId=3');
    await router.push('/units');
    expect(confirm).not.toHaveBeenCalled();
    await router.push('/events/new?unitId=3');
    await settle();
    await type(wrapper, 'notes', 'half a note');
    await router.push('/units');
    expect(confirm).toHaveBeenCalledOnce();
    expect(router.currentRoute.value.path).toBe('/events/new');
  });
});

