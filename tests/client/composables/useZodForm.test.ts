import { mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { afterEach, describe, expect, it } from 'vitest';
import { defineComponent, h } from 'vue';
import { z } from 'zod';
import { ApiError } from '../../../src/api/client';
import { useMutation, type Mutation } from '../../../src/composables/useMutation';
import { useZodForm, type ZodForm } from '../../../src/composables/useZodForm';
import { quasarOptions } from '../../../src/quasar-options';
import { resetClientState } from '../helpers';

const schema = z.object({ name: z.string().trim().min(1, 'required'), size: z.number().positive('above zero') });
type Values = { name: string; size: string };

// The form and a mutation inside a component (useMutation notifies through Quasar).
function withForm(send: (body: z.output<typeof schema>) => Promise<string>) {
  let form!: ZodForm<Values, typeof schema>;
  let mutation!: Mutation<[z.output<typeof schema>], string>;
  mount(
    defineComponent({
      setup() {
        form = useZodForm(schema, (): Values => ({ name: '', size: '' }), {
          toBody: (v) => ({ name: v.name, size: v.size === '' ? Number.NaN : Number(v.size) }),
          messages: { size: 'a positive number' },
        });
        mutation = useMutation(send, { inline: true });
        return () => h('div');
      },
    }),
    { global: { plugins: [[Quasar, quasarOptions]] }, attachTo: document.body },
  );
  return { form, mutation };
}

describe('useZodForm', () => {
  afterEach(resetClientState);

  it('shows a client error only for a touched field until a submit is tried, then for every field; nothing is sent while one remains', async () => {
    const sent: unknown[] = [];
    const { form, mutation } = withForm(async (body) => {
      sent.push(body);
      return 'ok';
    });
    expect(form.errorOf('name')).toBeUndefined();
    form.touch('name');
    expect(form.errorOf('name')).toBe('required');
    expect(form.errorOf('size')).toBeUndefined();

    expect(await form.submit(mutation)).toBeUndefined();
    expect(form.errorOf('size')).toBe('a positive number');
    expect(sent).toEqual([]);

    form.values.name = '  Bay 2 ';
    form.values.size = '3';
    expect(await form.submit(mutation)).toBe('ok');
    expect(sent).toEqual([{ name: 'Bay 2', size: 3 }]);
  });

  it('puts the server’s field errors on the same field names after a submit, and drops one when its field is edited', async () => {
    const { form, mutation } = withForm(async () => {
      throw new ApiError(400, 'invalid_input', 'Some fields are invalid.', { name: 'in use', size: 'too large for this site' });
    });
    form.values.name = 'Bay 2';
    form.values.size = '3';
    expect(await form.submit(mutation)).toBeUndefined();
    expect(mutation.error.value?.message).toBe('Some fields are invalid.');
    expect(form.errorOf('name')).toBe('in use');
    expect(form.errorOf('size')).toBe('too large for this site');

    form.values.name = 'Bay 3';
    await Promise.resolve();
    expect(form.errorOf('name')).toBeUndefined();
    expect(form.errorOf('size')).toBe('too large for this site');
  });
});
