import type { Knex } from "knex";

// Roadmaps (issue 14): a team-scoped chain of node steps N1 … N8 on one baseline (N0). `steps` holds the RoadmapStep
// array of lib/scaling/roadmap.ts as JSON (validated with lib/validation/roadmap.ts and composed by the engine before
// every write); revisions keep every saved version like scenario_revisions.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("roadmaps", (t) => {
    t.text("id").primary();
    t.text("team_id").notNullable().references("teams.id").onDelete("CASCADE");
    t.text("baseline_id").notNullable().references("baselines.id").onDelete("CASCADE");
    t.text("name").notNullable();
    t.text("steps").notNullable();
    t.integer("version").notNullable().defaultTo(1);
    t.integer("is_demo").notNullable().defaultTo(0);
    t.text("created_by").references("users.id").onDelete("SET NULL");
    t.integer("created_at").notNullable();
    t.text("updated_by").references("users.id").onDelete("SET NULL");
    t.integer("updated_at").notNullable();
    t.unique(["baseline_id", "name"]);
    t.index(["team_id"]);
  });
  await knex.schema.createTable("roadmap_revisions", (t) => {
    t.increments("id");
    t.text("roadmap_id").notNullable().references("roadmaps.id").onDelete("CASCADE");
    t.integer("version").notNullable();
    t.text("user_id").references("users.id").onDelete("SET NULL");
    t.integer("at").notNullable();
    t.text("summary").notNullable();
    t.text("name").notNullable();
    t.text("steps").notNullable();
    t.index(["roadmap_id", "version"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("roadmap_revisions");
  await knex.schema.dropTableIfExists("roadmaps");
}
