import {
  DataTypes,
  type Transaction,
  Model,
  UniqueConstraintError,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
} from "sequelize";
import type Stripe from "stripe";
import { sequelize } from "~/db.server";

/** A payments webhook event as received; its id makes redeliveries harmless. */
export class PaymentEvent extends Model<InferAttributes<PaymentEvent>, InferCreationAttributes<PaymentEvent>> {
  declare eventId: string;
  declare type: string;
  declare objectId: string | null;
  declare livemode: boolean;
  /** The event as received, for the record; its signature was checked before it got here. */
  declare payload: Stripe.Event;
  declare eventCreatedAt: Date;
  declare receivedAt: CreationOptional<Date>;
  declare processedAt: Date | null;

  /** Stores the event once; `duplicate` is true when this id was already recorded. */
  static async record(event: Stripe.Event, transaction?: Transaction): Promise<{ event: PaymentEvent; duplicate: boolean }> {
    const object = event.data.object;
    // Inside a caller's transaction a failed insert would poison it, so the id is claimed with
    // ON CONFLICT DO NOTHING there; alone, the unique violation tells the same.
    if (transaction) {
      const [rows] = await PaymentEvent.sequelize!.query(
        `INSERT INTO payment_events (event_id, type, object_id, livemode, payload, event_created_at)
         VALUES ($1, $2, $3, $4, $5, $6) ON CONFLICT (event_id) DO NOTHING RETURNING event_id`,
        {
          bind: [
            event.id,
            event.type,
            "id" in object && typeof object.id === "string" ? object.id : null,
            event.livemode,
            JSON.stringify(event),
            new Date(event.created * 1000),
          ],
          transaction,
        },
      );
      const existing = await PaymentEvent.findByPk(event.id, { rejectOnEmpty: true, transaction });
      return { event: existing, duplicate: rows.length === 0 };
    }
    try {
      const row = await PaymentEvent.create({
        eventId: event.id,
        type: event.type,
        objectId: "id" in object && typeof object.id === "string" ? object.id : null,
        livemode: event.livemode,
        payload: event,
        eventCreatedAt: new Date(event.created * 1000),
        processedAt: null,
      });
      return { event: row, duplicate: false };
    } catch (err) {
      if (!(err instanceof UniqueConstraintError)) throw err;
      const existing = await PaymentEvent.findByPk(event.id, { rejectOnEmpty: true });
      return { event: existing, duplicate: true };
    }
  }
}

PaymentEvent.init(
  {
    eventId: { type: DataTypes.TEXT, primaryKey: true },
    type: { type: DataTypes.TEXT, allowNull: false },
    objectId: { type: DataTypes.TEXT, allowNull: true },
    livemode: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    payload: { type: DataTypes.JSONB, allowNull: false },
    eventCreatedAt: { type: DataTypes.DATE, allowNull: false },
    receivedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    processedAt: { type: DataTypes.DATE, allowNull: true },
  },
  { sequelize, tableName: "payment_events", underscored: true, timestamps: false },
);
