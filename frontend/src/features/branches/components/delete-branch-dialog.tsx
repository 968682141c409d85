import { ConfirmDialog } from 'primereact/confirmdialog';
import type { Branch } from '@loambook/common';
import { useLastValue } from '@/lib/use-last-value';

interface DeleteBranchDialogProps {
  branch: Branch | null;
  onConfirm: (branch: Branch) => void;
  onClose: () => void;
}

export function DeleteBranchDialog({ branch, onConfirm, onClose }: DeleteBranchDialogProps) {
  const shown = useLastValue(branch);
  return (
    <ConfirmDialog
      visible={branch !== null}
      onHide={onClose}
      header="Delete branch"
      icon="pi pi-exclamation-triangle"
      message={shown ? `Delete branch ${shown.code}? This cannot be undone.` : ''}
      acceptLabel="Delete"
      rejectLabel="Keep it"
      acceptClassName="p-button-danger"
      defaultFocus="reject"
      accept={() => branch && onConfirm(branch)}
      reject={onClose}
      className="app-dialog"
    />
  );
}
