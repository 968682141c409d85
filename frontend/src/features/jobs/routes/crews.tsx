import '../jobs.css';
import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import { Checkbox } from 'primereact/checkbox';
import { Column } from 'primereact/column';
import { DataTable } from 'primereact/datatable';
import { Dialog } from 'primereact/dialog';
import { InputText } from 'primereact/inputtext';
import { Message } from 'primereact/message';
import { Tag } from 'primereact/tag';
import type { Crew, CrewMember } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { FormField } from '@/components/form-field';
import { TableSkeleton } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { PageHeader } from '@/components/page-header';
import { Select } from '@/components/select';
import { tableLayout } from '@/components/table-layout';
import { serverFormErrors, type FieldErrors } from '@/lib/form-errors';
import { useMediaQuery, WIDE_TABLE } from '@/lib/use-media-query';
import { useCurrentBranch } from '@/features/branches/current-branch';
import { useUsers } from '@/features/users/api/get-users';
import { useCrews } from '../api/get-crews';
import { useCreateCrew, useUpdateCrew } from '../api/save-crew';

/** The branch's crews: who leads each (a crew lead of the branch) and who works with them. */
export default function CrewsRoute() {
  const wide = useMediaQuery(WIDE_TABLE);
  const { branchId, branch } = useCurrentBranch();
  const crews = useCrews(branchId, { enabled: branchId !== null });
  const [editing, setEditing] = useState<Crew | 'new' | null>(null);

  return (
    <div className="page jobs-page">
      <PageHeader
        title="Crews"
        description={
          branch
            ? `${branch.code} · ${branch.name}: each crew has a crew lead, who sees the crew’s jobs on their phone.`
            : 'Each branch’s crews.'
        }
        actions={
          branchId ? (
            <Button type="button" label="New crew" icon="pi pi-plus" onClick={() => setEditing('new')} />
          ) : null
        }
      />
      <Card className="content-card">
        {!branchId ? (
          <EmptyState icon="pi-building" title="Choose a branch">
            Crews belong to a branch: pick one in the switcher at the top.
          </EmptyState>
        ) : crews.isPending ? (
          <TableSkeleton rows={3} label="Loading crews" />
        ) : crews.isError ? (
          <ApiErrorMessage error={crews.error} />
        ) : crews.data.length === 0 ? (
          <EmptyState icon="pi-users" title="No crews yet">
            Add the branch’s first crew with New crew. Its lead must have the crew lead role (invite them
            under People first).
          </EmptyState>
        ) : (
          <DataTable value={crews.data} dataKey="id" className="data-table" {...tableLayout(wide)}>
            <Column header="Crew" body={(c: Crew) => <span className="strong">{c.name}</span>} />
            <Column header="Lead" field="leadName" />
            <Column
              header="Members"
              body={(c: Crew) =>
                c.members.length ? (
                  c.members.map((m) => m.name).join(', ')
                ) : (
                  <span className="muted">None listed</span>
                )
              }
            />
            <Column
              header="Status"
              body={(c: Crew) => (
                <Tag
                  value={c.active ? 'Active' : 'Not in use'}
                  severity={c.active ? 'success' : 'secondary'}
                />
              )}
            />
            <Column
              header="Actions"
              headerClassName="visually-hidden-header actions-column"
              className="actions-column"
              body={(c: Crew) => (
                <Button
                  type="button"
                  label="Edit"
                  icon="pi pi-pencil"
                  text
                  aria-label={`Edit ${c.name}`}
                  onClick={() => setEditing(c)}
                />
              )}
            />
          </DataTable>
        )}
      </Card>
      {branchId ? (
        <Dialog
          visible={editing !== null}
          onHide={() => setEditing(null)}
          header={editing === 'new' ? 'New crew' : editing ? `Edit ${editing.name}` : ''}
          className="app-dialog"
          style={{ width: '36rem' }}
          breakpoints={{ '640px': 'calc(100vw - 1.5rem)' }}
          draggable={false}
          resizable={false}
        >
          {editing ? (
            <CrewForm
              key={editing === 'new' ? 'new' : editing.id}
              branchId={branchId}
              crew={editing === 'new' ? null : editing}
              onDone={() => setEditing(null)}
            />
          ) : null}
        </Dialog>
      ) : null}
    </div>
  );
}

type Field = 'name' | 'leadUserId' | 'members';
interface MemberRow extends CrewMember {
  key: string;
}
let memberKey = 0;

function CrewForm({ branchId, crew, onDone }: { branchId: string; crew: Crew | null; onDone: () => void }) {
  const notify = useNotify();
  const create = useCreateCrew();
  const update = useUpdateCrew();
  const users = useUsers({ branchId });
  const leads = (users.data ?? [])
    .filter((u) => u.role === 'crew_lead' && u.active && u.branchIds.includes(branchId))
    .sort((a, b) => a.name.localeCompare(b.name));
  const [name, setName] = useState(crew?.name ?? '');
  const [leadUserId, setLeadUserId] = useState<string | null>(crew?.leadUserId ?? null);
  const [active, setActive] = useState(crew?.active ?? true);
  const [members, setMembers] = useState<MemberRow[]>(
    (crew?.members ?? []).map((m) => ({ ...m, key: `m${++memberKey}` })),
  );
  const [submitted, setSubmitted] = useState(false);
  const [serverFields, setServerFields] = useState<FieldErrors<Field>>({});
  const [formError, setFormError] = useState<string | null>(null);

  const errors: FieldErrors<Field> = {};
  if (!name.trim()) errors.name = 'Name the crew, e.g. “Crew 2” or “North team”.';
  else if (name.trim().length > 60) errors.name = 'At most 60 characters.';
  if (!leadUserId) errors.leadUserId = 'Choose the crew lead.';
  const memberErrors = members.map((m) => (m.name.trim() ? null : 'Enter the name, or remove the row.'));
  const errorFor = (f: Field) => serverFields[f] ?? (submitted ? errors[f] : undefined);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setSubmitted(true);
    setFormError(null);
    if (Object.values(errors).some(Boolean) || memberErrors.some(Boolean)) return;
    const input = {
      branchId,
      name: name.trim(),
      leadUserId: leadUserId!,
      active,
      members: members.map((m) => ({
        ...(m.id ? { id: m.id } : {}),
        name: m.name.trim(),
        phone: m.phone?.trim() || null,
      })),
    };
    try {
      const saved = crew
        ? await update.mutateAsync({ id: crew.id, patch: input })
        : await create.mutateAsync(input);
      notify.success(crew ? 'Crew saved' : 'Crew added', `${saved.name}, led by ${saved.leadName}.`);
      onDone();
    } catch (error) {
      const mapped = serverFormErrors(error, ['name', 'leadUserId', 'members'] as const);
      setServerFields(mapped.fields);
      setFormError(mapped.form);
    }
  };

  return (
    <form className="dialog-form" onSubmit={submit} noValidate aria-label="Crew">
      {formError ? <Message severity="error" text={formError} className="form-message" /> : null}
      <FormField id="crew-name" label="Name" error={errorFor('name')} required>
        {({ invalid, ...control }) => (
          <InputText
            {...control}
            value={name}
            maxLength={60}
            onChange={(e) => setName(e.target.value)}
            invalid={invalid}
            className="w-full"
          />
        )}
      </FormField>
      <FormField
        id="crew-lead"
        label="Crew lead"
        error={errorFor('leadUserId')}
        required
        hint={
          leads.length
            ? 'People of this branch with the crew lead role.'
            : 'No crew lead in this branch yet: invite one under People.'
        }
      >
        {({ invalid, ...control }) => (
          <Select
            inputId={control.id}
            aria-describedby={control['aria-describedby']}
            value={leadUserId}
            options={leads.map((u) => ({ value: u.id, label: u.name }))}
            onChange={(e) => setLeadUserId(e.value as string)}
            placeholder={users.isPending ? 'Loading…' : 'Choose the lead'}
            invalid={invalid}
            className="w-full"
          />
        )}
      </FormField>
      <fieldset className="members">
        <legend className="form-field__label">Members</legend>
        {members.length === 0 ? <p className="muted">Nobody listed besides the lead.</p> : null}
        {members.map((m, i) => (
          <div key={m.key} className="members__row">
            <FormField
              id={`member-name-${m.key}`}
              label={`Member ${i + 1} name`}
              error={submitted ? memberErrors[i] : null}
            >
              {({ invalid, ...control }) => (
                <InputText
                  {...control}
                  value={m.name}
                  maxLength={100}
                  onChange={(e) =>
                    setMembers((all) =>
                      all.map((x) => (x.key === m.key ? { ...x, name: e.target.value } : x)),
                    )
                  }
                  invalid={invalid}
                  className="w-full"
                />
              )}
            </FormField>
            <FormField id={`member-phone-${m.key}`} label="Phone">
              {({ invalid, ...control }) => (
                <InputText
                  {...control}
                  value={m.phone ?? ''}
                  type="tel"
                  maxLength={32}
                  onChange={(e) =>
                    setMembers((all) =>
                      all.map((x) => (x.key === m.key ? { ...x, phone: e.target.value } : x)),
                    )
                  }
                  invalid={invalid}
                  className="w-full"
                />
              )}
            </FormField>
            <Button
              type="button"
              icon="pi pi-times"
              text
              rounded
              severity="secondary"
              aria-label={`Remove ${m.name.trim() || `member ${i + 1}`}`}
              onClick={() => setMembers((all) => all.filter((x) => x.key !== m.key))}
            />
          </div>
        ))}
        {errorFor('members') ? <small className="form-field__error">{errorFor('members')}</small> : null}
        <Button
          type="button"
          label="Add member"
          icon="pi pi-plus"
          outlined
          size="small"
          onClick={() => setMembers((all) => [...all, { key: `m${++memberKey}`, name: '', phone: '' }])}
        />
      </fieldset>
      <div className="checkbox-row">
        <Checkbox inputId="crew-active" checked={active} onChange={(e) => setActive(!!e.checked)} />
        <label htmlFor="crew-active">In use (shown on the calendar)</label>
      </div>
      <div className="dialog-actions">
        <Button type="button" label="Cancel" text onClick={onDone} />
        <Button
          type="submit"
          label={crew ? 'Save crew' : 'Add crew'}
          icon="pi pi-check"
          loading={create.isPending || update.isPending}
        />
      </div>
    </form>
  );
}
