import { enableAutoUnmount } from '@vue/test-utils';
import { afterEach, describe, expect, it } from 'vitest';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, storeToken } from '../helpers';

enableAutoUnmount(afterEach);

function signedInAs(user: ReturnType<typeof makeUser>) {
  storeToken('valid');
  scriptFetch({ 'GET /api/auth/me': { body: user }, 'GET /api/health': { body: healthy } });
}

describe('DeskPage', () => {
  afterEach(resetClientState);

  it('greets the user by name in the desk heading', async () => {
    signedInAs(makeUser({ name: 'Ruth Okafor' }));
    const { wrapper } = await mountApp('/');

    const title = wrapper.get('[data-test="desk-title"]');
    expect(title.element.tagName).toBe('H1');
    expect(title.text()).toBe('Welcome, Ruth Okafor');
  });

  it('lists each of the user’s roles with a line on what that role does in Gapsight', async () => {
    signedInAs(makeUser({ roles: ['manager', 'tester'] }));
    const { wrapper } = await mountApp('/');

    const roles = wrapper.findAll('[data-test="desk-role"]');
    expect(roles.map((role) => role.attributes('data-role'))).toEqual(['tester', 'manager']);
    expect(roles[0].text()).toContain('Test engineer');
    expect(roles[0].text()).toContain('uploads test-set CSV exports and sweep files');
    expect(roles[1].text()).toContain('Operations manager');
    expect(roles[1].text()).toContain('signs off the decision');
  });

  it('tells a user without any role to ask an administrator', async () => {
    signedInAs(makeUser({ roles: [] }));
    const { wrapper } = await mountApp('/');

    expect(wrapper.findAll('[data-test="desk-role"]')).toHaveLength(0);
    expect(wrapper.get('[data-test="desk-no-role"]').text()).toContain('Ask an administrator');
  });

  it('says honestly that no work lists exist yet instead of showing an empty table', async () => {
    signedInAs(makeUser());
    const { wrapper } = await mountApp('/');

    const empty = wrapper.get('[data-test="desk-empty"]');
    expect(empty.text()).toContain('Nothing is listed here yet.');
    expect(empty.text()).toContain('not part of this version');
  });
});
