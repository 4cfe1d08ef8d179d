import type { Knex } from "knex";

/**
 * Verified e-mail addresses (issue 12, finding 6): an account must prove its address before it may send invites or
 * report e-mails.
 *
 * - users.email_verified_at: when the address was proven (null = not yet). Accounts that exist when this migration
 *   runs were created before verification existed and have been used as they are: they count as verified (their
 *   created_at), so an existing install keeps working. Every account created afterwards starts unverified.
 * - email_verifications: one row per verification link sent; only the SHA-256 of the token is stored, single use,
 *   expiry 24 h. The rows also pace the "send the link again" action.
 * - outbox.user_id: who caused a message (the inviter, the report's sender, the account being verified). The
 *   per-user sending limit counts it, and the Outbox page shows users their own account mail.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("users", (t) => {
    t.integer("email_verified_at");
  });
  await knex("users").update({ email_verified_at: knex.ref("created_at") });
  await knex.schema.createTable("email_verifications", (t) => {
    t.text("id").primary();
    t.text("user_id").notNullable().references("users.id").onDelete("CASCADE");
    t.text("email").notNullable();
    t.text("token_hash").notNullable().unique();
    t.integer("created_at").notNullable();
    t.integer("expires_at").notNullable();
    t.integer("used_at");
    t.index(["user_id", "created_at"]);
  });
  await knex.schema.alterTable("outbox", (t) => {
    t.text("user_id").references("users.id").onDelete("SET NULL");
    t.index(["user_id", "created_at"]);
    t.index(["team_id", "created_at"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("outbox", (t) => {
    t.dropIndex(["team_id", "created_at"]);
    t.dropIndex(["user_id", "created_at"]);
    t.dropForeign(["user_id"]);
    t.dropColumn("user_id");
  });
  await knex.schema.dropTableIfExists("email_verifications");
  await knex.schema.alterTable("users", (t) => {
    t.dropColumn("email_verified_at");
  });
}
