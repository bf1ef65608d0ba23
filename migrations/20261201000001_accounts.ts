import type { Knex } from "knex";

// Users, sessions (the lucia adapter fixes the names of their key columns), organizations,
// memberships, invitations, single-use e-mail tokens, the outgoing mail queue and the audit log.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("auth_user", (t) => {
    t.text("id").primary();
    t.text("email").notNullable().unique(); // stored lower-cased
    t.text("name").notNullable();
    t.text("password_hash").notNullable();
    t.timestamp("email_verified_at", { useTz: true });
    // Sessions created before this instant are replaced by a new one on their next request.
    t.timestamp("rotate_sessions_before", { useTz: true });
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });

  await knex.schema.createTable("user_session", (t) => {
    t.text("id").primary();
    t.timestamp("expires_at", { useTz: true }).notNullable();
    t.text("user_id").notNullable().references("id").inTable("auth_user").onDelete("CASCADE");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["user_id"]);
  });

  await knex.schema.createTable("organizations", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.text("name").notNullable();
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });

  await knex.schema.createTable("memberships", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("organization_id").notNullable().references("id").inTable("organizations").onDelete("CASCADE");
    t.text("user_id").notNullable().references("id").inTable("auth_user").onDelete("CASCADE");
    t.text("role").notNullable();
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(["organization_id", "user_id"]);
    t.index(["user_id"]);
  });
  await knex.raw(
    "ALTER TABLE memberships ADD CONSTRAINT memberships_role_check CHECK (role IN ('admin','manager','data_lead','annotator'))",
  );

  await knex.schema.createTable("invitations", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("organization_id").notNullable().references("id").inTable("organizations").onDelete("CASCADE");
    t.text("email").notNullable();
    t.text("role").notNullable();
    t.text("token_hash").notNullable().unique();
    t.text("invited_by").references("id").inTable("auth_user").onDelete("SET NULL");
    t.timestamp("expires_at", { useTz: true }).notNullable();
    t.timestamp("accepted_at", { useTz: true });
    t.text("accepted_by").references("id").inTable("auth_user").onDelete("SET NULL");
    t.timestamp("revoked_at", { useTz: true });
    t.timestamp("last_sent_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.integer("send_count").notNullable().defaultTo(1);
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["organization_id", "created_at"]);
  });
  await knex.raw(
    "ALTER TABLE invitations ADD CONSTRAINT invitations_role_check CHECK (role IN ('admin','manager','data_lead','annotator'))",
  );
  // At most one pending invitation per address and organization.
  await knex.raw(
    "CREATE UNIQUE INDEX invitations_pending_unique ON invitations (organization_id, email) WHERE accepted_at IS NULL AND revoked_at IS NULL",
  );

  await knex.schema.createTable("email_tokens", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.text("user_id").notNullable().references("id").inTable("auth_user").onDelete("CASCADE");
    t.text("purpose").notNullable(); // reset_password | verify_email
    t.text("email").notNullable();
    t.text("token_hash").notNullable().unique();
    t.timestamp("expires_at", { useTz: true }).notNullable();
    t.timestamp("used_at", { useTz: true });
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["user_id", "purpose"]);
  });

  await knex.schema.createTable("outbound_emails", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("organization_id").references("id").inTable("organizations").onDelete("CASCADE");
    t.text("to_address").notNullable();
    t.text("subject").notNullable();
    t.text("body_text").notNullable();
    t.text("body_html").notNullable();
    t.text("kind").notNullable();
    t.text("status").notNullable().defaultTo("queued"); // queued | sent
    t.integer("attempts").notNullable().defaultTo(0);
    t.text("last_error");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("sent_at", { useTz: true });
    t.index(["status", "created_at"]);
  });

  await knex.schema.createTable("audit_events", (t) => {
    t.bigIncrements("id").primary();
    t.uuid("organization_id").references("id").inTable("organizations").onDelete("CASCADE");
    t.text("actor_user_id").references("id").inTable("auth_user").onDelete("SET NULL");
    t.text("actor_label").notNullable(); // e-mail at the time, kept if the user is deleted
    t.text("action").notNullable();
    t.text("target_type");
    t.text("target_id");
    t.text("target_label");
    t.jsonb("details").notNullable().defaultTo("{}");
    t.text("ip");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["organization_id", "id"]);
    t.index(["organization_id", "action", "id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of [
    "audit_events",
    "outbound_emails",
    "email_tokens",
    "invitations",
    "memberships",
    "organizations",
    "user_session",
    "auth_user",
  ]) {
    await knex.schema.dropTableIfExists(table);
  }
}
