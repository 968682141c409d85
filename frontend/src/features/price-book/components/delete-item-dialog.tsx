import { ConfirmDialog } from 'primereact/confirmdialog';
import type { PriceBookItem } from '@loambook/common';
import { useLastValue } from '@/lib/use-last-value';

interface DeleteItemDialogProps {
  item: PriceBookItem | null;
  onConfirm: (item: PriceBookItem) => void;
  onClose: () => void;
}

export function DeleteItemDialog({ item, onConfirm, onClose }: DeleteItemDialogProps) {
  const shown = useLastValue(item);
  return (
    <ConfirmDialog
      visible={item !== null}
      onHide={onClose}
      header="Delete price-book item"
      icon="pi pi-exclamation-triangle"
      message={
        shown
          ? `Delete ${shown.code} (${shown.description})? No proposal uses it yet. This cannot be undone.`
          : ''
      }
      acceptLabel="Delete item"
      rejectLabel="Keep it"
      acceptClassName="p-button-danger"
      defaultFocus="reject"
      accept={() => item && onConfirm(item)}
      reject={onClose}
      className="app-dialog"
    />
  );
}
