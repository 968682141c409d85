import type { Knex } from 'knex';
// knex.raw treats every ? as a binding: write {0,1} in a regex, never ?.

/**
 * What proposal pricing and the approval queue need beyond the selling schema:
 * - branches.commission_rate_pct: the branch's default commission rate, for the preview on a proposal
 *   until the commission plans of issue #5 exist (8 is a placeholder default, not a trade figure);
 * - proposals.tax_treatment / tax_rate_pct: the branch's sales-tax setting the totals were computed with,
 *   so a later change of the branch's setting never changes a proposal already made;
 * - proposal_options: the remaining computed totals (customer total, gross profit, markup, materials
 *   cost, discount as % of list), percentages unconstrained in size (a tiny cost makes a huge markup),
 *   and a check that the printed figures add up;
 * - approval_requests.approver: who may decide the request (branch manager, or only the owner);
 * - a trigger that freezes the options and lines of a version once sent, superseded, signed or declined.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    alter table branches
      add column commission_rate_pct numeric(5,2) not null default 8
        check (commission_rate_pct between 0 and 100);

    alter table proposals
      add column tax_treatment text check (tax_treatment in ('materials_cost', 'invoice')),
      add column tax_rate_pct numeric(6,3) check (tax_rate_pct between 0 and 100);

    alter table proposal_options
      alter column gross_margin_pct type numeric,
      add column discount_pct numeric(7,2) not null default 0 check (discount_pct between 0 and 100),
      add column materials_cost_total numeric(14,2) not null default 0,
      add column customer_total numeric(14,2) not null default 0,
      add column gross_profit numeric(14,2) not null default 0,
      add column markup_pct numeric,
      add constraint option_totals_add_up check (
        net_total = list_total - discount_total
        and discount_total between 0 and list_total
        and customer_total in (net_total, net_total + tax_total));

    alter table approval_requests
      add column approver text not null default 'owner' check (approver in ('branch_manager', 'owner'));
    alter table approval_requests alter column approver drop default;

    -- A version that went to the homeowner (or was replaced, signed or declined) is a record: an edit makes
    -- a new version instead. Its options and lines can no longer be added, changed or removed.
    create function proposal_content_frozen() returns trigger language plpgsql as $$
    declare
      pid uuid;
      st text;
    begin
      if tg_table_name = 'proposal_options' then
        pid := coalesce(new.proposal_id, old.proposal_id);
      else
        select o.proposal_id into pid from proposal_options o where o.id = coalesce(new.option_id, old.option_id);
      end if;
      select status into st from proposals where id = pid;
      if st in ('sent', 'signed', 'superseded', 'declined') then
        raise exception 'proposal % is %: its options and lines cannot change', pid, st
          using errcode = 'restrict_violation';
      end if;
      return coalesce(new, old);
    end $$;
    create trigger proposal_options_frozen before insert or update or delete on proposal_options
      for each row execute function proposal_content_frozen();
    create trigger proposal_lines_frozen before insert or update or delete on proposal_lines
      for each row execute function proposal_content_frozen();
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    drop trigger proposal_lines_frozen on proposal_lines;
    drop trigger proposal_options_frozen on proposal_options;
    drop function proposal_content_frozen();
    alter table approval_requests drop column approver;
    alter table proposal_options
      drop constraint option_totals_add_up,
      drop column markup_pct, drop column gross_profit, drop column customer_total,
      drop column materials_cost_total, drop column discount_pct,
      alter column gross_margin_pct type numeric(7,2);
    alter table proposals drop column tax_rate_pct, drop column tax_treatment;
    alter table branches drop column commission_rate_pct;
  `);
}
