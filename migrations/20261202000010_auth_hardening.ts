import type { Knex } from "knex";

// Issue 12 findings 2 and 9: known devices (a client that signed in to an account before keeps working under
// throttling), password-reset tokens (only their SHA-256 stored, single use, 1 hour) and each session's
// creation time (the absolute session lifetime). Times are INTEGER ms; lucia's sessions.expires_at stays in seconds.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("known_devices", (t) => {
    t.text("token_hash").primary();
    t.text("user_id").notNullable().references("users.id").onDelete("CASCADE");
    t.integer("created_at").notNullable();
    t.integer("last_used_at").notNullable();
    t.index(["user_id"]);
  });
  await knex.schema.createTable("password_resets", (t) => {
    t.text("id").primary();
    t.text("user_id").notNullable().references("users.id").onDelete("CASCADE");
    t.text("token_hash").notNullable().unique();
    t.integer("created_at").notNullable();
    t.integer("expires_at").notNullable();
    t.integer("used_at");
    t.index(["user_id", "created_at"]);
  });
  await knex.schema.alterTable("sessions", (t) => {
    t.integer("created_at").notNullable().defaultTo(0);
  });
  // Sessions from before this migration count from now (not from 1970, which would end them at once).
  await knex("sessions").update({ created_at: Date.now() });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("sessions", (t) => {
    t.dropColumn("created_at");
  });
  await knex.schema.dropTableIfExists("password_resets");
  await knex.schema.dropTableIfExists("known_devices");
}
