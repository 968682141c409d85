import { Select } from '@/components/select';
import { ALL_BRANCHES, useCurrentBranch } from '../current-branch';

/** Picks the branch the lists show; shown only when there is a choice to make. */
export function BranchSwitcher({ id = 'branch-switcher' }: { id?: string }) {
  const { branchId, setBranchId, branches, allowAll, showSwitcher } = useCurrentBranch();
  if (!showSwitcher) return null;
  const options = [
    ...(allowAll ? [{ label: 'All branches', value: ALL_BRANCHES }] : []),
    ...branches.map((b) => ({ label: `${b.code} · ${b.name}`, value: b.id })),
  ];
  return (
    <div className="branch-switcher">
      <label htmlFor={id} className="branch-switcher__label">
        Branch
      </label>
      <Select
        inputId={id}
        value={branchId ?? ALL_BRANCHES}
        options={options}
        onChange={(e) => setBranchId(e.value === ALL_BRANCHES ? null : (e.value as string))}
        className="branch-switcher__dropdown"
        panelClassName="branch-switcher__panel"
        placeholder="Choose a branch"
      />
    </div>
  );
}
