import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import type { User } from "./user.server";
import type { Workshop } from "./workshop.server";
import { sequelize } from "~/db.server";

export const APPLICATION_STATUSES = ["waiting", "verified", "refused"] as const;
export type ApplicationStatus = (typeof APPLICATION_STATUSES)[number];

/** One application to be a workshop: the business's particulars and its document (a key in the private bucket). */
export class WorkshopApplication extends Model<InferAttributes<WorkshopApplication>, InferCreationAttributes<WorkshopApplication>> {
  declare id: CreationOptional<string>;
  declare workshopId: string;
  declare applicantId: string;
  declare businessName: string;
  declare address: string;
  declare registrationNumber: string;
  declare documentKey: string;
  declare documentType: string;
  declare documentName: string;
  declare documentBytes: number;
  declare status: CreationOptional<ApplicationStatus>;
  declare decidedAt: CreationOptional<Date | null>;
  declare decidedBy: CreationOptional<string | null>;
  declare decisionNote: CreationOptional<string | null>;
  declare decisionMailedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;

  /** Present when a query includes them (models/index.server.ts). */
  declare workshop?: NonAttribute<Workshop>;
  declare applicant?: NonAttribute<User>;
}

WorkshopApplication.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    workshopId: { type: DataTypes.UUID, allowNull: false },
    applicantId: { type: DataTypes.UUID, allowNull: false },
    businessName: { type: DataTypes.TEXT, allowNull: false },
    address: { type: DataTypes.TEXT, allowNull: false },
    registrationNumber: { type: DataTypes.TEXT, allowNull: false },
    documentKey: { type: DataTypes.TEXT, allowNull: false },
    documentType: { type: DataTypes.TEXT, allowNull: false },
    documentName: { type: DataTypes.TEXT, allowNull: false },
    documentBytes: { type: DataTypes.INTEGER, allowNull: false },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "waiting" },
    decidedAt: { type: DataTypes.DATE, allowNull: true },
    decidedBy: { type: DataTypes.UUID, allowNull: true },
    decisionNote: { type: DataTypes.TEXT, allowNull: true },
    decisionMailedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  },
  { sequelize, tableName: "workshop_applications", underscored: true, timestamps: false },
);
