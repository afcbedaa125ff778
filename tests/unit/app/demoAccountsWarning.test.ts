// @vitest-environment happy-dom
import { describe, expect, it } from 'vitest';
import { mount } from '@vue/test-utils';
import { QueryClient, VueQueryPlugin } from '@tanstack/vue-query';
import type { AdminStatus } from '@shared/api/adminStatus';
import DemoAccountsWarning from '@/components/app/DemoAccountsWarning.vue';
import { adminStatusKey } from '@/api/adminStatus';

/** Mounts the warning over a query cache already holding `status` (no request is made). */
function mountWith(status: AdminStatus) {
  const queryClient = new QueryClient({ defaultOptions: { queries: { staleTime: Infinity, retry: false } } });
  queryClient.setQueryData(adminStatusKey, status);
  return mount(DemoAccountsWarning, { global: { plugins: [[VueQueryPlugin, { queryClient }]] } });
}

describe('the demo accounts warning', () => {
  it('names each demo account that can sign in and says what to do', () => {
    const wrapper = mountWith({
      demoAccounts: [
        { email: 'admin@larch-hollow.example', name: 'Dana Okafor (demo admin)', role: 'admin' },
        { email: 'ana.reyes@larch-hollow.example', name: 'Ana Reyes (demo student)', role: 'student' },
      ],
    });
    const warning = wrapper.find('[data-testid="demo-accounts-warning"]');
    expect(warning.exists()).toBe(true);
    expect(warning.findAll('li').map((li) => li.text())).toEqual([
      'admin@larch-hollow.example · admin · Dana Okafor (demo admin)',
      'ana.reyes@larch-hollow.example · student · Ana Reyes (demo student)',
    ]);
    const text = warning.text().replace(/\s+/g, ' ');
    expect(text).toContain('These 2 demo accounts have the password printed in the README');
    expect(text).toContain('as an administrator too');
    expect(text).toContain('deactivate or delete them');
    expect(text).toContain('DEMO=off');
    expect(text).toContain('npm run cli -- create-admin');
  });

  it('does not claim administrator access when no demo admin is left', () => {
    const wrapper = mountWith({ demoAccounts: [{ email: 'tom.becker@larch-hollow.example', name: 'Tom Becker (demo student)', role: 'student' }] });
    const text = wrapper.text().replace(/\s+/g, ' ');
    expect(text).toContain('This demo account has the password printed in the README');
    expect(text).not.toContain('administrator too');
  });

  it('shows nothing once no demo account can sign in', () => {
    expect(mountWith({ demoAccounts: [] }).find('[data-testid="demo-accounts-warning"]').exists()).toBe(false);
  });
});
