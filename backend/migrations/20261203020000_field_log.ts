import type { Knex } from 'knex';
// knex.raw treats every ? as a binding: write {0,1} in a regex, never ?.

/**
 * The crew's log and the completion record (issue #4, J2), on top of the jobs schema:
 * - day notes are a record like the install rows: written once, never changed or removed;
 * - the re-survey taken at completion is final once written;
 * - a warranty's terms never change once issued (only its stored certificate's key may be filled in);
 * - completion rows, re-survey points and warranties carry their job's branch (the same trigger as the
 *   other child rows of a job).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    create function field_record_frozen() returns trigger language plpgsql as $$
    begin
      raise exception '% rows are a record: they cannot be changed or deleted', tg_table_name
        using errcode = 'restrict_violation';
    end $$;

    create trigger job_day_notes_no_update before update or delete on job_day_notes
      for each row execute function field_record_frozen();
    create trigger job_survey_points_no_update before update or delete on job_survey_points
      for each row execute function field_record_frozen();

    create function warranties_terms_frozen() returns trigger language plpgsql as $$
    begin
      if tg_op = 'DELETE' then
        raise exception 'an issued warranty cannot be deleted' using errcode = 'restrict_violation';
      end if;
      if (new.job_id, new.branch_id, new.number, new.term_years, new.covers, new.exclusions, new.transferable,
          new.issued_on, new.issued_by)
         is distinct from
         (old.job_id, old.branch_id, old.number, old.term_years, old.covers, old.exclusions, old.transferable,
          old.issued_on, old.issued_by) then
        raise exception 'the terms of an issued warranty cannot change' using errcode = 'restrict_violation';
      end if;
      return new;
    end $$;
    create trigger warranties_terms_frozen before update or delete on warranties
      for each row execute function warranties_terms_frozen();

    create trigger job_completions_branch before insert on job_completions
      for each row execute function job_child_branch_matches();
    create trigger job_survey_points_branch before insert on job_survey_points
      for each row execute function job_child_branch_matches();
    create trigger warranties_branch before insert on warranties
      for each row execute function job_child_branch_matches();

    create index warranties_branch_idx on warranties (branch_id, number);
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    drop index warranties_branch_idx;
    drop trigger warranties_branch on warranties;
    drop trigger job_survey_points_branch on job_survey_points;
    drop trigger job_completions_branch on job_completions;
    drop trigger warranties_terms_frozen on warranties;
    drop function warranties_terms_frozen();
    drop trigger job_survey_points_no_update on job_survey_points;
    drop trigger job_day_notes_no_update on job_day_notes;
    drop function field_record_frozen();
  `);
}
