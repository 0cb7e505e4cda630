import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/db.server";

/** A message in a thread. `body` is stored as the other side sees it (masked before a sale; `masked` says so). */
export class Message extends Model<InferAttributes<Message>, InferCreationAttributes<Message>> {
  declare id: CreationOptional<string>;
  declare threadId: string;
  declare senderId: string;
  declare body: string;
  declare masked: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
}

Message.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    threadId: { type: DataTypes.UUID, allowNull: false },
    senderId: { type: DataTypes.UUID, allowNull: false },
    body: { type: DataTypes.TEXT, allowNull: false },
    masked: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "messages", underscored: true, updatedAt: false },
);
