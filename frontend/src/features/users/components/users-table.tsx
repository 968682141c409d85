import { useMemo, useState } from 'react';
import { Button } from 'primereact/button';
import { Column } from 'primereact/column';
import { DataTable } from 'primereact/datatable';
import { Select } from '@/components/select';
import { IconField } from 'primereact/iconfield';
import { InputIcon } from 'primereact/inputicon';
import { InputText } from 'primereact/inputtext';
import { Tag } from 'primereact/tag';
import { ROLE_LABELS, ROLES, type Branch, type Role, type UserSummary } from '@loambook/common';
import { formatDateTime, formatRecent } from '@/lib/format';
import { tableLayout } from '@/components/table-layout';
import { useMediaQuery, WIDE_TABLE } from '@/lib/use-media-query';
import { useAppAbility } from '@/features/auth/ability';
import { useCurrentUser } from '@/features/auth/auth-provider';
import { canChange, STATUS_LABELS, statusOf, type UserStatus } from '../user-rules';

interface UserRow extends UserSummary {
  roleLabel: string;
  branchCodes: string;
  codes: string[];
  otherBranches: number;
  status: UserStatus;
  statusLabel: string;
  /** ISO text sorts in time order; "" (never) sorts first. */
  lastSignInSort: string;
}

export interface UserActions {
  onEdit: (user: UserSummary) => void;
  onDeactivate: (user: UserSummary) => void;
  onReactivate: (user: UserSummary) => void;
  onResend: (user: UserSummary) => void;
  /** The id of the person an action is running for, to show it as busy. */
  busyId: string | null;
}

const STATUS_SEVERITY: Record<UserStatus, 'success' | 'warning' | 'secondary'> = {
  active: 'success',
  pending: 'warning',
  deactivated: 'secondary',
};

const PLURAL_ROLE: Record<Role, string> = {
  owner: 'Owners',
  branch_manager: 'Branch managers',
  salesperson: 'Salespeople',
  bookkeeper: 'Bookkeepers',
  crew_lead: 'Crew leads',
};
const ROLE_FILTER_OPTIONS = [
  { label: 'Everyone', value: 'all' },
  ...ROLES.map((r) => ({ label: PLURAL_ROLE[r], value: r })),
];

export function UsersTable({
  users,
  branches,
  actions,
}: {
  users: UserSummary[];
  branches: Branch[];
  actions: UserActions;
}) {
  const ability = useAppAbility();
  const me = useCurrentUser();
  const [search, setSearch] = useState('');
  const wide = useMediaQuery(WIDE_TABLE);
  const [roleFilter, setRoleFilter] = useState<Role | 'all'>('all');

  const rows = useMemo<UserRow[]>(() => {
    const codeOf = new Map(branches.map((b) => [b.id, b.code]));
    return users.map((u) => {
      const codes = u.branchIds.flatMap((id) => codeOf.get(id) ?? []).sort();
      const status = statusOf(u);
      return {
        ...u,
        roleLabel: ROLE_LABELS[u.role],
        codes,
        branchCodes: codes.join(' '),
        otherBranches: u.branchIds.length - codes.length,
        status,
        statusLabel: STATUS_LABELS[status],
        lastSignInSort: u.lastSignInAt ?? '',
      };
    });
  }, [users, branches]);

  const shown = roleFilter === 'all' ? rows : rows.filter((r) => r.role === roleFilter);

  const header = (
    <div className="table-toolbar">
      <label htmlFor="people-search" className="visually-hidden">
        Search people
      </label>
      <IconField iconPosition="left" className="table-toolbar__search">
        <InputIcon className="pi pi-search" />
        <InputText
          id="people-search"
          type="search"
          value={search}
          onChange={(e) => setSearch(e.target.value)}
          placeholder="Search name, e-mail, branch…"
        />
      </IconField>
      <div className="table-toolbar__filter">
        <label htmlFor="people-show" className="table-toolbar__filter-label">
          Show
        </label>
        <Select
          inputId="people-show"
          value={roleFilter}
          options={ROLE_FILTER_OPTIONS}
          onChange={(e) => setRoleFilter(e.value as Role | 'all')}
          className="table-toolbar__dropdown"
        />
      </div>
      <span className="table-toolbar__count">
        {shown.length === 1 ? '1 person' : `${shown.length} people`}
      </span>
    </div>
  );

  /** On a wide screen an icon with its name as a tooltip keeps the column narrow; on a phone, the words. */
  const action = (
    key: string,
    label: string,
    name: string,
    icon: string,
    onClick: () => void,
    opts: { severity?: 'danger' | 'success'; loading?: boolean } = {},
  ) => (
    <Button
      key={key}
      type="button"
      label={wide ? undefined : label}
      aria-label={name}
      tooltip={wide ? label : undefined}
      tooltipOptions={{ position: 'top', showDelay: 300 }}
      icon={icon}
      text
      rounded={wide}
      size="small"
      severity={opts.severity}
      loading={opts.loading}
      onClick={onClick}
    />
  );

  const actionsBody = (u: UserRow) => {
    if (!canChange(ability, u)) return null;
    const busy = actions.busyId === u.id;
    return (
      <div className="row-actions">
        {action('edit', 'Edit', `Edit ${u.name}`, 'pi pi-pencil', () => actions.onEdit(u))}
        {u.active && u.invitationPending
          ? // Not "Resend invitation": that name would also answer to the dialog's "Send invitation".
            action(
              'resend',
              'Resend invite',
              `Resend invite to ${u.name}`,
              'pi pi-send',
              () => actions.onResend(u),
              {
                loading: busy,
              },
            )
          : null}
        {u.active && u.id !== me.id
          ? action(
              'deactivate',
              'Deactivate',
              `Deactivate ${u.name}`,
              'pi pi-ban',
              () => actions.onDeactivate(u),
              {
                severity: 'danger',
              },
            )
          : null}
        {!u.active
          ? action(
              'reactivate',
              'Reactivate',
              `Reactivate ${u.name}`,
              'pi pi-replay',
              () => actions.onReactivate(u),
              {
                severity: 'success',
                loading: busy,
              },
            )
          : null}
      </div>
    );
  };

  return (
    <DataTable
      value={shown}
      dataKey="id"
      header={header}
      globalFilter={search}
      globalFilterFields={['name', 'email', 'roleLabel', 'branchCodes', 'statusLabel']}
      sortField="name"
      sortOrder={1}
      removableSort
      stripedRows
      size="small"
      {...tableLayout(wide)}
      className="data-table"
      emptyMessage="Nobody matches your search."
      rowClassName={(u: UserRow) => (u.active ? '' : 'row--inactive')}
      aria-label="People"
    >
      <Column
        field="name"
        header="Name"
        sortable
        body={(u: UserRow) => (
          <span className="person-name">
            {u.name}
            {u.id === me.id ? <span className="muted"> (you)</span> : null}
          </span>
        )}
      />
      <Column
        field="email"
        header="E-mail"
        sortable
        body={(u: UserRow) => (
          <span className="email-cell" title={u.email}>
            {u.email}
          </span>
        )}
      />
      <Column field="roleLabel" header="Role" sortable bodyClassName="nowrap" />
      <Column
        field="branchCodes"
        header="Branches"
        sortable
        body={(u: UserRow) =>
          u.codes.length === 0 && u.otherBranches === 0 ? (
            <span className="muted nowrap">
              {u.role === 'owner' || u.role === 'bookkeeper' ? 'All branches' : 'None'}
            </span>
          ) : (
            <span className="code-list">
              {u.codes.map((c) => (
                <Tag key={c} value={c} className="branch-code" />
              ))}
              {u.otherBranches ? <span className="muted">+{u.otherBranches} other</span> : null}
            </span>
          )
        }
      />
      <Column
        field="statusLabel"
        header="Status"
        sortable
        bodyClassName="nowrap"
        body={(u: UserRow) => <Tag value={u.statusLabel} severity={STATUS_SEVERITY[u.status]} rounded />}
      />
      <Column
        field="lastSignInSort"
        header="Last sign-in"
        sortable
        bodyClassName="nowrap"
        body={(u: UserRow) =>
          u.lastSignInAt ? (
            <span title={formatDateTime(u.lastSignInAt)}>{formatRecent(u.lastSignInAt)}</span>
          ) : (
            <span className="muted">Never</span>
          )
        }
      />
      {/* Kept in view at the right while a wide table scrolls sideways. */}
      <Column
        header="Actions"
        headerClassName="visually-hidden-header"
        body={actionsBody}
        frozen={wide}
        alignFrozen="right"
        className="actions-column"
      />
    </DataTable>
  );
}
