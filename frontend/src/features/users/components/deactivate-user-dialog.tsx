import { ConfirmDialog } from 'primereact/confirmdialog';
import type { UserSummary } from '@loambook/common';
import { useLastValue } from '@/lib/use-last-value';

export function DeactivateUserDialog({
  user,
  onConfirm,
  onClose,
}: {
  user: UserSummary | null;
  onConfirm: (user: UserSummary) => void;
  onClose: () => void;
}) {
  const shown = useLastValue(user);
  return (
    <ConfirmDialog
      visible={user !== null}
      onHide={onClose}
      header={shown ? `Deactivate ${shown.name}?` : 'Deactivate'}
      icon="pi pi-ban"
      message={
        shown
          ? `${shown.name} will be signed out and can no longer sign in. Their records stay, and you can reactivate them later.`
          : ''
      }
      acceptLabel="Deactivate"
      rejectLabel="Cancel"
      acceptClassName="p-button-danger"
      defaultFocus="reject"
      accept={() => user && onConfirm(user)}
      reject={onClose}
      className="app-dialog"
    />
  );
}
