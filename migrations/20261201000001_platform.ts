import type { Knex } from "knex";

// Times are INTEGER milliseconds since the epoch, except lucia's sessions.expires_at (seconds, its adapter's format).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("users", (t) => {
    t.text("id").primary();
    t.text("email").notNullable().unique();
    t.text("name").notNullable();
    t.text("password_hash").notNullable();
    t.integer("created_at").notNullable();
  });
  await knex.schema.createTable("sessions", (t) => {
    t.text("id").primary();
    t.integer("expires_at").notNullable();
    t.text("user_id").notNullable().references("users.id").onDelete("CASCADE");
    t.index(["user_id"]);
  });
  await knex.schema.createTable("teams", (t) => {
    t.text("id").primary();
    t.text("name").notNullable();
    t.integer("is_demo").notNullable().defaultTo(0);
    t.text("created_by").references("users.id").onDelete("SET NULL");
    t.integer("created_at").notNullable();
  });
  await knex.schema.createTable("memberships", (t) => {
    t.text("team_id").notNullable().references("teams.id").onDelete("CASCADE");
    t.text("user_id").notNullable().references("users.id").onDelete("CASCADE");
    t.text("role").notNullable().checkIn(["owner", "editor", "viewer"]);
    t.integer("created_at").notNullable();
    t.primary(["team_id", "user_id"]);
    t.index(["user_id"]);
  });
  await knex.schema.createTable("invites", (t) => {
    t.text("id").primary();
    t.text("team_id").notNullable().references("teams.id").onDelete("CASCADE");
    t.text("email").notNullable();
    t.text("role").notNullable().checkIn(["owner", "editor", "viewer"]);
    t.text("token_hash").notNullable().unique();
    t.text("invited_by").references("users.id").onDelete("SET NULL");
    t.integer("created_at").notNullable();
    t.integer("expires_at").notNullable();
    t.integer("accepted_at");
    t.text("accepted_by").references("users.id").onDelete("SET NULL");
    t.integer("revoked_at");
    t.index(["team_id"]);
  });
  // Sign-in throttling: one row per key ("account:<email>" or "client:<address>").
  await knex.schema.createTable("sign_in_throttle", (t) => {
    t.text("key").primary();
    t.integer("failures").notNullable();
    t.integer("window_start").notNullable();
    t.integer("locked_until");
  });
  await knex.schema.createTable("audit_log", (t) => {
    t.increments("id");
    t.text("team_id").references("teams.id").onDelete("CASCADE");
    t.text("user_id").references("users.id").onDelete("SET NULL");
    t.text("action").notNullable();
    t.text("entity_type");
    t.text("entity_id");
    t.text("detail");
    t.integer("at").notNullable();
    t.index(["team_id", "at"]);
  });
  await knex.schema.createTable("outbox", (t) => {
    t.increments("id");
    t.text("team_id").references("teams.id").onDelete("SET NULL");
    t.text("kind").notNullable();
    t.text("to_addresses").notNullable();
    t.text("subject").notNullable();
    t.text("text_body").notNullable();
    t.text("html_body");
    t.text("status").notNullable().checkIn(["queued", "sent", "failed"]);
    t.text("error");
    t.text("message_id");
    t.integer("created_at").notNullable();
    t.integer("sent_at");
  });
  // What the local fake SMTP server received (dev, demo and tests only).
  await knex.schema.createTable("captured_mail", (t) => {
    t.increments("id");
    t.integer("outbox_id").references("outbox.id").onDelete("SET NULL");
    t.text("envelope_from");
    t.text("envelope_to").notNullable();
    t.text("subject");
    t.text("raw").notNullable();
    t.integer("received_at").notNullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const t of ["captured_mail", "outbox", "audit_log", "sign_in_throttle", "invites", "memberships", "teams", "sessions", "users"]) {
    await knex.schema.dropTableIfExists(t);
  }
}
