import type { Knex } from "knex";

// Engine 2: vias in series with each net (all nullable: a class without them has none, as before).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("wire_classes", (t) => {
    t.integer("vias_per_net");
    t.double("via_ohm");
    t.double("via_width_m");
    t.double("via_height_m");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("wire_classes", (t) => {
    t.dropColumn("vias_per_net");
    t.dropColumn("via_ohm");
    t.dropColumn("via_width_m");
    t.dropColumn("via_height_m");
  });
}
