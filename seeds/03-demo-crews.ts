import type { Knex } from 'knex';
import crews from './data/demo-crews.json';

/**
 * The demo branches' crews (seeds/data/demo-crews.json): two per branch, led by the branch's demo crew
 * lead, with invented members and 555-01xx phones. Runs after 01-demo-company. Running it again changes
 * nothing that is already there: crews are matched by branch and name, and a crew someone has since
 * edited keeps the edit.
 */
interface DemoCrew {
  branch: string;
  name: string;
  lead: string;
  members: { name: string; phone: string | null }[];
}

export async function seed(knex: Knex): Promise<void> {
  await knex.transaction(async (trx) => {
    const branchIds = new Map<string, string>(
      (await trx('branches').select('id', 'code')).map((r: { id: string; code: string }) => [r.code, r.id]),
    );
    for (const c of crews.crews as DemoCrew[]) {
      const branchId = branchIds.get(c.branch);
      if (!branchId) throw new Error(`demo-crews.json names unknown branch ${c.branch}`);
      const lead = await trx('users as u')
        .join('user_branches as ub', 'ub.user_id', 'u.id')
        .whereRaw('lower(u.email) = lower(?)', [c.lead])
        .where({ 'u.role': 'crew_lead', 'ub.branch_id': branchId })
        .first('u.id');
      if (!lead) throw new Error(`demo-crews.json: ${c.lead} is not a crew lead of ${c.branch}`);
      const [made] = await trx('crews')
        .insert({ branch_id: branchId, name: c.name, lead_user_id: lead.id })
        .onConflict(['branch_id', 'name'])
        .ignore()
        .returning('id');
      if (!made) continue; // already there
      await trx('crew_members').insert(
        c.members.map((m, position) => ({
          crew_id: made.id,
          branch_id: branchId,
          name: m.name,
          phone: m.phone,
          position,
        })),
      );
    }
  });
}
