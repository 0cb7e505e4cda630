import {
  DataTypes,
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
  static async record(event: Stripe.Event): Promise<{ event: PaymentEvent; duplicate: boolean }> {
    const object = event.data.object;
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
