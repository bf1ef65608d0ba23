import type { Knex } from "knex";

// The Documents table sorts by token count as well as by date and title: an index in the same
// shape as the other two keeps that sort a walk of the index. Files refused at upload (unknown
// ending, too large) are kept as rows so the upload reports them, and have no format.
export async function up(knex: Knex): Promise<void> {
  await knex.raw("CREATE INDEX documents_corpus_tokens_id ON documents (corpus_id, token_count, id)");
  await knex.raw("ALTER TABLE upload_files ALTER COLUMN format DROP NOT NULL");
  await knex.raw(
    "ALTER TABLE upload_files ADD CONSTRAINT upload_files_state_check CHECK (state IN ('queued','processing','ready','failed'))",
  );
  await knex.raw("CREATE INDEX upload_files_corpus_created_id ON upload_files (corpus_id, created_at, id)");
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw("DROP INDEX IF EXISTS upload_files_corpus_created_id");
  await knex.raw("ALTER TABLE upload_files DROP CONSTRAINT IF EXISTS upload_files_state_check");
  await knex.raw("UPDATE upload_files SET format = 'txt' WHERE format IS NULL");
  await knex.raw("ALTER TABLE upload_files ALTER COLUMN format SET NOT NULL");
  await knex.raw("DROP INDEX IF EXISTS documents_corpus_tokens_id");
}
