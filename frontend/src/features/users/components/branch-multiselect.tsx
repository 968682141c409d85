import { MultiSelectField } from '@/components/select';
import type { Branch } from '@loambook/common';
import type { ControlProps } from '@/components/form-field';

interface BranchMultiSelectProps extends Omit<ControlProps, 'id'> {
  inputId: string;
  branches: Branch[];
  value: string[];
  onChange: (ids: string[]) => void;
  disabled?: boolean;
  loading?: boolean;
}

export function BranchMultiSelect({
  inputId,
  branches,
  value,
  onChange,
  disabled,
  loading,
  invalid,
  ...aria
}: BranchMultiSelectProps) {
  return (
    <MultiSelectField
      inputId={inputId}
      {...aria}
      value={value}
      options={branches.map((b) => ({ label: `${b.code} · ${b.name}`, value: b.id }))}
      onChange={(e) => onChange((e.value as string[] | null) ?? [])}
      display="chip"
      placeholder={loading ? 'Loading branches…' : 'Choose branches'}
      disabled={disabled || loading}
      invalid={invalid}
      showSelectAll={false}
      emptyMessage="No branches to choose from"
      className="w-full"
      panelClassName="app-overlay"
    />
  );
}
