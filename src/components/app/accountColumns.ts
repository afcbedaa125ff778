/**
 * The administration table's columns for an account's state and the actions on it
 * (`AccountActions.vue`), kept apart so the admin view only spreads them into its own columns.
 */
import { h } from 'vue';
import { NTag, type DataTableColumns } from 'naive-ui';
import type { AccountView } from '@shared/api/auth';
import AccountActions from './AccountActions.vue';
import { formatWhen } from './files';

export function accountColumns(): DataTableColumns<AccountView> {
  return [
    {
      title: 'Status',
      key: 'deactivatedAt',
      width: 120,
      render: (row) =>
        row.deactivatedAt
          ? h(NTag, { size: 'small', type: 'warning', bordered: false, title: `Deactivated ${formatWhen(row.deactivatedAt)}` }, () => 'Deactivated')
          : h(NTag, { size: 'small', bordered: false }, () => 'Active'),
    },
    { title: 'Actions', key: 'actions', width: 220, render: (row) => h(AccountActions, { account: row }) },
  ];
}
