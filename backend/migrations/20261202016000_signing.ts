import type { Knex } from 'knex';
// knex.raw treats every ? as a binding: write {0,1} in a regex, never ?.

/**
 * What sending and signing need beyond the selling schema:
 * - signing_links.deposit_amount: the deposit the proposal was sent with (the contract copies it);
 *   signing_links.sent_by: who sent it;
 * - contracts.deposit_amount: the deposit the signed contract asks for, never more than its price;
 * - the frozen terms of a contract now also cover the date of the transaction (signed_on), the deposit and
 *   the evidence of signing (address, device, in person or not).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    alter table signing_links
      add column deposit_amount numeric(14,2) check (deposit_amount >= 0),
      add column sent_by uuid references users(id);
    create index signing_links_proposal_idx on signing_links (proposal_id);

    alter table contracts
      add column deposit_amount numeric(14,2) not null default 0
        check (deposit_amount >= 0 and deposit_amount <= price);
    create index contracts_lead_idx on contracts (lead_id, signed_at desc);

    create or replace function contracts_terms_frozen() returns trigger language plpgsql as $$
    begin
      if (new.price, new.tax, new.option_id, new.signed_by_name, new.signed_at, new.signature_png,
          new.cancellation_statement, new.last_day_to_cancel, new.notices, new.signed_on, new.deposit_amount,
          new.signed_ip, new.signed_user_agent, new.signed_in_person)
         is distinct from
         (old.price, old.tax, old.option_id, old.signed_by_name, old.signed_at, old.signature_png,
          old.cancellation_statement, old.last_day_to_cancel, old.notices, old.signed_on, old.deposit_amount,
          old.signed_ip, old.signed_user_agent, old.signed_in_person) then
        raise exception 'the terms of a signed contract cannot change' using errcode = 'restrict_violation';
      end if;
      return new;
    end $$;
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    create or replace function contracts_terms_frozen() returns trigger language plpgsql as $$
    begin
      if (new.price, new.tax, new.option_id, new.signed_by_name, new.signed_at, new.signature_png,
          new.cancellation_statement, new.last_day_to_cancel, new.notices)
         is distinct from
         (old.price, old.tax, old.option_id, old.signed_by_name, old.signed_at, old.signature_png,
          old.cancellation_statement, old.last_day_to_cancel, old.notices) then
        raise exception 'the terms of a signed contract cannot change' using errcode = 'restrict_violation';
      end if;
      return new;
    end $$;
    drop index contracts_lead_idx;
    alter table contracts drop column deposit_amount;
    drop index signing_links_proposal_idx;
    alter table signing_links drop column sent_by, drop column deposit_amount;
  `);
}
