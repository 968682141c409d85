import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Dialog } from 'primereact/dialog';
import { Select } from '@/components/select';
import { InputText } from 'primereact/inputtext';
import { Message } from 'primereact/message';
import type { Branch, Role, UpdateUserRequest, UserSummary } from '@loambook/common';
import { FormField } from '@/components/form-field';
import { hasErrors, serverFormErrors, type FieldErrors } from '@/lib/form-errors';
import { useLastValue } from '@/lib/use-last-value';
import { useAppAbility } from '@/features/auth/ability';
import { useCurrentUser } from '@/features/auth/auth-provider';
import { useUpdateUser } from '../api/update-user';
import { assignableRoles, needsBranch, roleOptions, validatePerson, type PersonField } from '../user-rules';
import { BranchMultiSelect } from './branch-multiselect';

const FIELDS: readonly PersonField[] = ['name', 'role', 'branchIds'];

interface EditUserDialogProps {
  user: UserSummary | null;
  onClose: () => void;
  onSaved: (user: UserSummary) => void;
  /** The branches the signed-in person manages (all of them, for an owner). */
  branches: Branch[];
  branchesLoading?: boolean;
}

export function EditUserDialog({ user, ...rest }: EditUserDialogProps) {
  const shown = useLastValue(user);
  return (
    <Dialog
      visible={user !== null}
      onHide={rest.onClose}
      header={shown ? `Edit ${shown.name}` : 'Edit person'}
      className="app-dialog"
      style={{ width: '34rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1.5rem)' }}
      draggable={false}
      resizable={false}
    >
      {shown ? <EditForm key={shown.id} user={shown} {...rest} /> : null}
    </Dialog>
  );
}

const sameSet = (a: string[], b: string[]) => a.length === b.length && a.every((x) => b.includes(x));

function EditForm({
  user,
  onClose,
  onSaved,
  branches,
  branchesLoading,
}: EditUserDialogProps & { user: UserSummary }) {
  const ability = useAppAbility();
  const me = useCurrentUser();
  const update = useUpdateUser();
  const isSelf = me.id === user.id;
  const mine = branches.map((b) => b.id);
  // A manager edits only memberships in their own branches; the others stay as they are.
  const initialBranches = user.branchIds.filter((id) => mine.includes(id));
  const elsewhere = user.branchIds.length - initialBranches.length;

  const [name, setName] = useState(user.name);
  const [role, setRole] = useState<Role>(user.role);
  const [branchIds, setBranchIds] = useState<string[]>(initialBranches);
  const [submitted, setSubmitted] = useState(false);
  const [serverFields, setServerFields] = useState<FieldErrors<PersonField>>({});
  const [formMessage, setFormMessage] = useState<string | null>(null);

  const branchesApply = needsBranch(role);
  const clientErrors = validatePerson(
    { name, role, branchIds: branchesApply ? [...branchIds, ...(elsewhere ? ['elsewhere'] : [])] : [] },
    { checkEmail: false },
  );
  const errorFor = (f: PersonField) => serverFields[f] ?? (submitted ? clientErrors[f] : undefined);
  const clearServer = (f: PersonField) => setServerFields((s) => (s[f] ? { ...s, [f]: undefined } : s));

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setSubmitted(true);
    setFormMessage(null);
    if (hasErrors(clientErrors)) return;
    const patch: UpdateUserRequest = {};
    if (name.trim() !== user.name) patch.name = name.trim();
    if (role !== user.role) patch.role = role;
    const nextBranches = branchesApply ? branchIds : [];
    if (!sameSet(nextBranches, initialBranches)) patch.branchIds = nextBranches;
    if (Object.keys(patch).length === 0) {
      onClose();
      return;
    }
    try {
      onSaved(await update.mutateAsync({ id: user.id, patch }));
    } catch (error) {
      const mapped = serverFormErrors(error, FIELDS);
      setServerFields(mapped.fields);
      setFormMessage(mapped.form);
    }
  };

  return (
    <form id="edit-user-form" onSubmit={submit} noValidate className="dialog-form">
      <p className="dialog-intro">
        <i className="pi pi-envelope" aria-hidden="true" /> {user.email}
      </p>
      {formMessage ? <Message severity="error" text={formMessage} className="form-message" /> : null}
      <FormField id="edit-name" label="Name" error={errorFor('name')} required>
        {({ invalid, ...control }) => (
          <InputText
            {...control}
            value={name}
            onChange={(e) => {
              setName(e.target.value);
              clearServer('name');
            }}
            invalid={invalid}
            maxLength={100}
            autoComplete="off"
            className="w-full"
          />
        )}
      </FormField>
      <FormField
        id="edit-role"
        label="Role"
        error={errorFor('role')}
        required
        hint={isSelf ? 'You cannot change your own role; another owner can.' : undefined}
      >
        {({ invalid, id, ...aria }) => (
          <Select
            inputId={id}
            {...aria}
            value={role}
            options={roleOptions(assignableRoles(ability, user))}
            onChange={(e) => {
              setRole(e.value as Role);
              clearServer('role');
            }}
            disabled={isSelf}
            invalid={invalid}
            className="w-full"
            panelClassName="app-overlay"
          />
        )}
      </FormField>
      <FormField
        id="edit-branches"
        label="Branches"
        error={errorFor('branchIds')}
        required={branchesApply}
        hint={
          !branchesApply
            ? 'Not needed: this role sees every branch.'
            : elsewhere
              ? `They also belong to ${elsewhere === 1 ? 'a branch' : `${elsewhere} branches`} you don’t manage; that stays as it is.`
              : undefined
        }
      >
        {({ id, ...control }) => (
          <BranchMultiSelect
            inputId={id}
            {...control}
            branches={branches}
            value={branchesApply ? branchIds : []}
            onChange={(ids) => {
              setBranchIds(ids);
              clearServer('branchIds');
            }}
            disabled={!branchesApply}
            loading={branchesLoading}
          />
        )}
      </FormField>
      <div className="dialog-actions">
        <Button
          type="button"
          label="Cancel"
          severity="secondary"
          outlined
          onClick={onClose}
          disabled={update.isPending}
        />
        <Button type="submit" label="Save changes" icon="pi pi-check" loading={update.isPending} />
      </div>
    </form>
  );
}
