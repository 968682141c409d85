import { lazy, Suspense } from 'react';
import { Dialog } from 'primereact/dialog';
import type { Branch, ContractView, Inspection, LeadDetail, ProposalDetail } from '@loambook/common';
import { PageLoading } from '@/components/loading';

const InPersonSigning = lazy(() => import('./in-person-signing'));

export interface InPersonSigningDialogProps {
  visible: boolean;
  proposal: ProposalDetail;
  lead: LeadDetail;
  branch: Branch;
  inspection: Inspection | null;
  onClose: () => void;
  onSigned: (contract: ContractView) => void;
}

/** The homeowner signs on this device: the same page as the e-mailed link, inside the app. */
export function InPersonSigningDialog({ visible, onClose, ...rest }: InPersonSigningDialogProps) {
  return (
    <Dialog
      visible={visible}
      onHide={onClose}
      header="Sign in person"
      className="app-dialog in-person-dialog"
      style={{ width: '60rem' }}
      breakpoints={{ '960px': '100vw' }}
      draggable={false}
      resizable={false}
      blockScroll
    >
      {visible ? (
        <Suspense fallback={<PageLoading label="Preparing the contract…" />}>
          <InPersonSigning onClose={onClose} {...rest} />
        </Suspense>
      ) : null}
    </Dialog>
  );
}
