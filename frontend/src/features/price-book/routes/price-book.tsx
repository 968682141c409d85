import { useState } from 'react';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import { Checkbox } from 'primereact/checkbox';
import { asSubject, type CreatePriceBookItemRequest, type PriceBookItem } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { TableSkeleton } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { PageHeader } from '@/components/page-header';
import { isApiError } from '@/lib/api-client';
import { useAppAbility } from '@/features/auth/ability';
import { useCurrentBranch } from '@/features/branches/current-branch';
import { useCreatePriceBookItem } from '../api/create-price-book-item';
import { useDeletePriceBookItem } from '../api/delete-price-book-item';
import { usePriceBook } from '../api/get-price-book';
import { useUpdatePriceBookItem } from '../api/update-price-book-item';
import { DeleteItemDialog } from '../components/delete-item-dialog';
import { PriceBookItemDialog, type ItemDialogState } from '../components/price-book-item-dialog';
import { PriceBookTable } from '../components/price-book-table';
import { itemPatch } from '../price-book-values';
import '../price-book.css';

const why = (error: unknown) => (isApiError(error) ? error.message : 'Try again in a moment.');

export default function PriceBookRoute() {
  const ability = useAppAbility();
  const notify = useNotify();
  const { branchId, branch, branches, setBranchId } = useCurrentBranch();
  const [showInactive, setShowInactive] = useState(true);
  const [dialog, setDialog] = useState<ItemDialogState | null>(null);
  const [toDelete, setToDelete] = useState<PriceBookItem | null>(null);
  const [busyId, setBusyId] = useState<string | null>(null);

  // Fetch deactivated items too, so that hiding and showing them needs no second request.
  const items = usePriceBook(branchId ? { branchId, includeInactive: true } : null);
  const create = useCreatePriceBookItem();
  const update = useUpdatePriceBookItem();
  const remove = useDeletePriceBookItem();

  const subject = branchId ? asSubject('PriceBook', { branchId }) : null;
  const canCreate = !!subject && ability.can('create', subject);
  const canEdit = !!subject && ability.can('update', subject);
  const canDelete = !!subject && ability.can('delete', subject);
  const branchLabel = branch ? `${branch.code} · ${branch.name}` : '';

  const save = async (input: CreatePriceBookItemRequest, item: PriceBookItem | null) => {
    if (!branchId) return;
    if (item) {
      const patch = itemPatch(item, input);
      if (Object.keys(patch).length > 0) await update.mutateAsync({ id: item.id, patch });
      notify.success('Item saved', `${input.code} · ${input.description}`);
    } else {
      await create.mutateAsync({ branchId, input });
      notify.success('Item added', `${input.code} is in the ${branch?.code ?? ''} price book.`);
    }
    setDialog(null);
  };

  const toggleActive = (item: PriceBookItem) => {
    setBusyId(item.id);
    update.mutate(
      { id: item.id, patch: { active: !item.active } },
      {
        onSuccess: () =>
          notify.success(
            item.active ? `${item.code} deactivated` : `${item.code} reactivated`,
            item.active
              ? 'New proposals no longer offer it; proposals already made keep it.'
              : 'New proposals offer it again.',
          ),
        onError: (error) => notify.error(`${item.code} was not changed`, why(error)),
        onSettled: () => setBusyId(null),
      },
    );
  };

  const confirmDelete = (item: PriceBookItem) => {
    setToDelete(null);
    remove.mutate(item.id, {
      onSuccess: () => notify.success('Item deleted', `${item.code} is gone from the price book.`),
      onError: (error) => notify.error(`${item.code} was not deleted`, why(error)),
    });
  };

  const shown = (items.data ?? []).filter((i) => showInactive || i.active);

  return (
    <div className="page">
      <PageHeader
        title="Price book"
        description={
          branchId
            ? canEdit
              ? `What ${branchLabel} charges and what each item costs it. Proposals copy an item’s figures when a line is added, so changes here never alter a proposal already made.`
              : `What ${branchLabel} charges. Only a branch manager or the owner can change it.`
            : 'Each branch keeps its own price book.'
        }
        actions={
          canCreate ? (
            <Button
              type="button"
              label="New item"
              icon="pi pi-plus"
              onClick={() => setDialog({ item: null })}
            />
          ) : null
        }
      />
      <Card className="content-card">
        {!branchId ? (
          <EmptyState icon="pi-building" title="Choose a branch">
            <p className="choose-branch__text">
              The price book belongs to a branch. Pick one here or with the branch switcher at the top.
            </p>
            <div className="choose-branch">
              {branches.map((b) => (
                <Button
                  key={b.id}
                  type="button"
                  label={`${b.code} · ${b.name}`}
                  outlined
                  onClick={() => setBranchId(b.id)}
                />
              ))}
            </div>
          </EmptyState>
        ) : items.isPending ? (
          <TableSkeleton label="Loading the price book" />
        ) : items.isError ? (
          <ApiErrorMessage error={items.error} />
        ) : items.data.length === 0 ? (
          <EmptyState icon="pi-list" title="No items yet">
            {canCreate
              ? 'Add what this branch sells — injection material per lb, points, piers, permits, mobilisation — with its cost and list price.'
              : 'This branch has no price book yet. Ask your branch manager to set it up.'}
          </EmptyState>
        ) : (
          <>
            <div className="price-book-filters">
              <Checkbox
                inputId="show-inactive"
                checked={showInactive}
                onChange={(e) => setShowInactive(!!e.checked)}
              />
              <label htmlFor="show-inactive">Show deactivated items</label>
            </div>
            <PriceBookTable
              items={shown}
              marginFloorPct={branch?.marginFloorPct ?? null}
              canEdit={canEdit}
              canDelete={canDelete}
              busyId={busyId}
              onEdit={(item) => setDialog({ item })}
              onToggleActive={toggleActive}
              onDelete={setToDelete}
            />
            {canDelete && items.data.some((i) => i.inUse) ? (
              <p className="table-footnote">
                An item a proposal uses cannot be deleted — it stays for the record. Deactivate it so new
                proposals no longer offer it.
              </p>
            ) : null}
          </>
        )}
      </Card>
      <PriceBookItemDialog
        state={dialog}
        branchLabel={branchLabel}
        marginFloorPct={branch?.marginFloorPct ?? null}
        onSubmit={save}
        onClose={() => setDialog(null)}
        pending={create.isPending || (update.isPending && busyId === null)}
      />
      <DeleteItemDialog item={toDelete} onConfirm={confirmDelete} onClose={() => setToDelete(null)} />
    </div>
  );
}
