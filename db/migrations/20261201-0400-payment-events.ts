import { DataTypes } from "sequelize";
import type { Migration } from "../migrator";

// Every payments webhook event received, keyed by the provider's event id: a redelivered event is
// recognised and not acted on twice. processed_at is set once the event's effect is applied.
export const up: Migration = async ({ context: qi }) => {
  const now = qi.sequelize.literal("now()");
  await qi.createTable("payment_events", {
    event_id: { type: DataTypes.TEXT, primaryKey: true },
    type: { type: DataTypes.TEXT, allowNull: false },
    object_id: { type: DataTypes.TEXT },
    livemode: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    payload: { type: DataTypes.JSONB, allowNull: false },
    event_created_at: { type: DataTypes.DATE, allowNull: false },
    received_at: { type: DataTypes.DATE, allowNull: false, defaultValue: now },
    processed_at: { type: DataTypes.DATE },
  });
  await qi.addIndex("payment_events", ["object_id"], { name: "payment_events_object" });
  await qi.addIndex("payment_events", ["type", "received_at"], { name: "payment_events_type" });
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable("payment_events");
};
