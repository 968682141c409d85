import { LEAD_STAGES, type LeadStage } from '@loambook/common';
import { PAGE_SIZES, type PageSize, type PipelineQuery, type PipelineSort } from './api/get-leads';

/**
 * The pipeline's filters live in the address (?stage=inspected,proposal_sent&q=ash&page=2), so a view
 * can be bookmarked, shared with the office, and comes back with the browser's Back button.
 * `order` is the order of the column as shown: "desc" on Age means the oldest leads first.
 */
export type PipelineView = Omit<PipelineQuery, 'branchId'>;

const SORTS: readonly PipelineSort[] = ['age', 'daysInStage', 'value', 'homeowner', 'stage'];
const WHOLE_DAYS = /^\d{1,5}$/;
export const MONEY_FILTER = /^\d{1,12}(\.\d{1,2})?$/;

export const DEFAULT_VIEW: PipelineView = {
  stages: [],
  salespersonId: null,
  minAgeDays: '',
  maxAgeDays: '',
  minValue: '',
  maxValue: '',
  q: '',
  approvalPending: false,
  // The leads that have waited longest in their stage first: who needs a call today.
  sort: 'daysInStage',
  order: 'desc',
  page: 1,
  pageSize: 25,
};

export function viewFromParams(params: URLSearchParams): PipelineView {
  const stages = (params.get('stage') ?? '')
    .split(',')
    .filter((s): s is LeadStage => (LEAD_STAGES as readonly string[]).includes(s));
  const sort = params.get('sort');
  const order = params.get('order');
  const page = Number(params.get('page'));
  const size = Number(params.get('size'));
  const days = (key: string) => {
    const v = params.get(key) ?? '';
    return WHOLE_DAYS.test(v) ? v : '';
  };
  const amount = (key: string) => {
    const v = params.get(key) ?? '';
    return MONEY_FILTER.test(v) ? v : '';
  };
  return {
    stages,
    salespersonId: params.get('salesperson') || null,
    minAgeDays: days('minAge'),
    maxAgeDays: days('maxAge'),
    minValue: amount('minValue'),
    maxValue: amount('maxValue'),
    q: params.get('q') ?? '',
    approvalPending: params.get('approvals') === 'waiting',
    sort: SORTS.includes(sort as PipelineSort) ? (sort as PipelineSort) : DEFAULT_VIEW.sort,
    order: order === 'asc' || order === 'desc' ? order : DEFAULT_VIEW.order,
    page: Number.isInteger(page) && page >= 1 ? page : 1,
    pageSize: (PAGE_SIZES as readonly number[]).includes(size) ? (size as PageSize) : DEFAULT_VIEW.pageSize,
  };
}

export function paramsFromView(view: PipelineView): URLSearchParams {
  const p = new URLSearchParams();
  if (view.stages.length) p.set('stage', view.stages.join(','));
  if (view.salespersonId) p.set('salesperson', view.salespersonId);
  if (view.minAgeDays) p.set('minAge', view.minAgeDays);
  if (view.maxAgeDays) p.set('maxAge', view.maxAgeDays);
  if (view.minValue) p.set('minValue', view.minValue);
  if (view.maxValue) p.set('maxValue', view.maxValue);
  if (view.q.trim()) p.set('q', view.q.trim());
  if (view.approvalPending) p.set('approvals', 'waiting');
  if (view.sort !== DEFAULT_VIEW.sort || view.order !== DEFAULT_VIEW.order) {
    p.set('sort', view.sort);
    p.set('order', view.order);
  }
  if (view.page > 1) p.set('page', String(view.page));
  if (view.pageSize !== DEFAULT_VIEW.pageSize) p.set('size', String(view.pageSize));
  return p;
}

/** Whether anything narrows the list (sorting and paging aside). */
export function isFiltered(view: PipelineView): boolean {
  return (
    view.stages.length > 0 ||
    !!view.salespersonId ||
    !!view.minAgeDays ||
    !!view.maxAgeDays ||
    !!view.minValue ||
    !!view.maxValue ||
    !!view.q.trim() ||
    view.approvalPending
  );
}

/**
 * The server sorts Age and Days in stage by the date the lead was entered or last moved, so the order of
 * those dates is the opposite of the order of the day counts shown.
 */
export function toQuery(view: PipelineView, branchId: string | null): PipelineQuery {
  const byDate = view.sort === 'age' || view.sort === 'daysInStage';
  const order = byDate ? (view.order === 'asc' ? 'desc' : 'asc') : view.order;
  return { ...view, branchId, order };
}
