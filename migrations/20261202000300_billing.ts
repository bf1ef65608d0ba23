import type { Knex } from "knex";

// Seats and billing: one billing account per organization (its payments customer and the state
// of its subscription as last fetched from the payments service), its invoices, the checkouts it
// started, and the webhook event ids already handled (so a replayed event changes nothing).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("billing_accounts", (t) => {
    t.uuid("organization_id").primary().references("id").inTable("organizations").onDelete("CASCADE");
    t.text("customer_id").unique();
    t.text("subscription_id");
    t.text("subscription_item_id");
    t.text("subscription_status");
    t.integer("paid_seats").notNullable().defaultTo(0);
    t.boolean("cancel_at_period_end").notNullable().defaultTo(false);
    t.timestamp("current_period_end", { useTz: true });
    t.integer("seat_price");
    t.text("currency");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw("ALTER TABLE billing_accounts ADD CONSTRAINT billing_accounts_paid_seats_check CHECK (paid_seats >= 0)");

  await knex.schema.createTable("billing_invoices", (t) => {
    t.text("id").primary();
    t.uuid("organization_id").notNullable().references("id").inTable("organizations").onDelete("CASCADE");
    t.text("subscription_id");
    t.text("number");
    t.text("status").notNullable();
    t.integer("amount_due").notNullable();
    t.integer("amount_paid").notNullable();
    t.text("currency").notNullable();
    t.timestamp("period_start", { useTz: true });
    t.timestamp("period_end", { useTz: true });
    t.timestamp("issued_at", { useTz: true }).notNullable();
    t.index(["organization_id", "issued_at"]);
  });

  await knex.schema.createTable("billing_checkouts", (t) => {
    t.text("id").primary();
    t.uuid("organization_id").notNullable().references("id").inTable("organizations").onDelete("CASCADE");
    t.integer("seats").notNullable();
    t.text("status").notNullable().defaultTo("open"); // open | complete
    t.text("created_by").references("id").inTable("auth_user").onDelete("SET NULL");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("completed_at", { useTz: true });
    t.index(["organization_id", "created_at"]);
  });

  await knex.schema.createTable("billing_webhook_events", (t) => {
    t.text("id").primary();
    t.text("type").notNullable();
    t.uuid("organization_id").references("id").inTable("organizations").onDelete("CASCADE");
    t.timestamp("received_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ["billing_webhook_events", "billing_checkouts", "billing_invoices", "billing_accounts"]) {
    await knex.schema.dropTableIfExists(table);
  }
}
