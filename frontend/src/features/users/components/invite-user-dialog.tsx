import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Dialog } from 'primereact/dialog';
import { Select } from '@/components/select';
import { InputText } from 'primereact/inputtext';
import { Message } from 'primereact/message';
import type { Branch, Role, UserSummary } from '@loambook/common';
import { FormField } from '@/components/form-field';
import { hasErrors, serverFormErrors, type FieldErrors } from '@/lib/form-errors';
import { useAppAbility } from '@/features/auth/ability';
import { useInviteUser } from '../api/invite-user';
import { invitableRoles, needsBranch, roleOptions, validatePerson, type PersonField } from '../user-rules';
import { BranchMultiSelect } from './branch-multiselect';

const FIELDS: readonly PersonField[] = ['name', 'email', 'role', 'branchIds'];

interface InviteUserDialogProps {
  visible: boolean;
  onClose: () => void;
  onInvited: (user: UserSummary) => void;
  branches: Branch[];
  branchesLoading?: boolean;
  /** Ticked at the start, e.g. the branch chosen in the switcher. */
  defaultBranchIds: string[];
}

export function InviteUserDialog(props: InviteUserDialogProps) {
  return (
    <Dialog
      visible={props.visible}
      onHide={props.onClose}
      header="Invite person"
      className="app-dialog"
      style={{ width: '34rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1.5rem)' }}
      draggable={false}
      resizable={false}
      dismissableMask={false}
    >
      {/* The dialog drops its content once closed, so every invitation starts from a clean form. */}
      <InviteForm {...props} />
    </Dialog>
  );
}

function InviteForm({
  onClose,
  onInvited,
  branches,
  branchesLoading,
  defaultBranchIds,
}: InviteUserDialogProps) {
  const ability = useAppAbility();
  const invite = useInviteUser();
  const roles = invitableRoles(ability);
  const [name, setName] = useState('');
  const [email, setEmail] = useState('');
  const [role, setRole] = useState<Role | null>(roles.length === 1 ? roles[0]! : null);
  const [branchIds, setBranchIds] = useState<string[]>(
    defaultBranchIds.length ? defaultBranchIds : branches.length === 1 ? [branches[0]!.id] : [],
  );
  const [submitted, setSubmitted] = useState(false);
  const [serverFields, setServerFields] = useState<FieldErrors<PersonField>>({});
  const [formMessage, setFormMessage] = useState<string | null>(null);

  const clientErrors = validatePerson({ name, email, role, branchIds }, { checkEmail: true });
  const errorFor = (f: PersonField) => serverFields[f] ?? (submitted ? clientErrors[f] : undefined);
  const clearServer = (f: PersonField) => setServerFields((s) => (s[f] ? { ...s, [f]: undefined } : s));
  const branchesApply = role === null || needsBranch(role);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setSubmitted(true);
    setFormMessage(null);
    if (hasErrors(clientErrors) || !role) return;
    try {
      const user = await invite.mutateAsync({
        name: name.trim(),
        email: email.trim(),
        role,
        branchIds: needsBranch(role) ? branchIds : [],
      });
      onInvited(user);
    } catch (error) {
      const mapped = serverFormErrors(error, FIELDS);
      setServerFields(mapped.fields);
      setFormMessage(mapped.form);
    }
  };

  return (
    <form id="invite-form" onSubmit={submit} noValidate className="dialog-form">
      <p className="dialog-intro">
        They get an e-mail with a link to choose a password. The link works once and expires after a while;
        you can send a new one from the list.
      </p>
      {formMessage ? <Message severity="error" text={formMessage} className="form-message" /> : null}
      <FormField id="invite-name" label="Name" error={errorFor('name')} required>
        {({ invalid, ...control }) => (
          <InputText
            {...control}
            value={name}
            onChange={(e) => {
              setName(e.target.value);
              clearServer('name');
            }}
            invalid={invalid}
            autoComplete="off"
            maxLength={100}
            className="w-full"
            autoFocus
          />
        )}
      </FormField>
      <FormField id="invite-email" label="E-mail" error={errorFor('email')} required>
        {({ invalid, ...control }) => (
          <InputText
            {...control}
            type="email"
            value={email}
            onChange={(e) => {
              setEmail(e.target.value);
              clearServer('email');
            }}
            invalid={invalid}
            autoComplete="off"
            maxLength={254}
            className="w-full"
          />
        )}
      </FormField>
      <FormField
        id="invite-role"
        label="Role"
        error={errorFor('role')}
        required
        hint={
          ability.can('manage', 'all')
            ? undefined
            : 'You can invite the roles listed here; an owner invites the others.'
        }
      >
        {({ invalid, id, ...aria }) => (
          <Select
            inputId={id}
            {...aria}
            value={role}
            options={roleOptions(roles)}
            onChange={(e) => {
              setRole(e.value as Role);
              clearServer('role');
            }}
            invalid={invalid}
            placeholder="Choose a role"
            className="w-full"
            panelClassName="app-overlay"
          />
        )}
      </FormField>
      <FormField
        id="invite-branches"
        label="Branches"
        error={errorFor('branchIds')}
        required={branchesApply}
        hint={
          branchesApply
            ? 'Where they work. They see this branch’s records.'
            : 'Not needed: this role sees every branch.'
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
          disabled={invite.isPending}
        />
        <Button type="submit" label="Send invitation" icon="pi pi-send" loading={invite.isPending} />
      </div>
    </form>
  );
}
