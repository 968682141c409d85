import type { Knex } from 'knex';
import type { Role } from '@loambook/common';
import { hashPassword } from '../backend/src/auth/password-hash';
import company from './data/demo-company.json';
import accounts from './data/demo-accounts.json';

/**
 * The invented demo company: three branches in invented towns and the accounts of
 * seeds/data/demo-accounts.json (mirrored by the README table). Running it again changes nothing
 * that is already there: branches and people are matched by code and e-mail.
 */
interface DemoAccount {
  email: string;
  password: string;
  role: Role;
  branches: string[];
  name: string;
}

export async function seed(knex: Knex): Promise<void> {
  await knex.transaction(async (trx) => {
    for (const b of company.branches) {
      await trx('branches')
        .insert({
          code: b.code,
          name: b.name,
          address_line1: b.addressLine1,
          city: b.city,
          state: b.state,
          postal_code: b.postalCode,
          phone: b.phone,
          timezone: b.timezone,
          margin_floor_pct: b.marginFloorPct,
          discount_limit_salesperson_pct: b.discountAuthority.salesperson,
          discount_limit_manager_pct: b.discountAuthority.branch_manager,
          sales_tax_treatment: b.salesTaxTreatment,
          sales_tax_rate_pct: b.salesTaxRatePct,
        })
        .onConflict('code')
        .ignore();
    }
    const branchIds = new Map<string, string>(
      (await trx('branches').select('id', 'code')).map((r: { id: string; code: string }) => [r.code, r.id]),
    );

    for (const a of accounts as DemoAccount[]) {
      let user = await trx('users').select('id').whereRaw('lower(email) = lower(?)', [a.email]).first();
      if (!user) {
        [user] = await trx('users')
          .insert({
            name: a.name,
            email: a.email,
            role: a.role,
            password_hash: await hashPassword(a.password),
          })
          .returning('id');
      }
      for (const code of a.branches) {
        const branchId = branchIds.get(code);
        if (!branchId) throw new Error(`demo-accounts.json names unknown branch ${code}`);
        await trx('user_branches').insert({ user_id: user.id, branch_id: branchId }).onConflict().ignore();
      }
    }
  });
}
