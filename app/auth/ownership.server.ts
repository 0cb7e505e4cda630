import type { FindOptions, Model, ModelStatic, Transaction, WhereOptions } from "sequelize";
import { isId } from "@shared/ids";

// The one ownership check: a record is reached by its id AND its owner in a single query. Someone
// else's record, a missing one and a malformed id all come back as null, so callers answer the same
// 404 to each and an id reveals nothing.

export type OwnOptions<M extends Model> = {
  transaction?: Transaction;
  /** Row lock (with a transaction): writes to one record run one after the other. */
  lock?: boolean;
  attributes?: FindOptions<M>["attributes"];
};

export async function findOwn<M extends Model>(
  model: ModelStatic<M>,
  id: unknown,
  owner: Record<string, string>,
  options: OwnOptions<M> = {},
): Promise<M | null> {
  if (!isId(id)) return null;
  const where: WhereOptions = { id, ...owner };
  return model.findOne({
    where,
    // Only what was asked for: an undefined `attributes` would override a scope's.
    ...(options.attributes ? { attributes: options.attributes } : {}),
    ...(options.transaction ? { transaction: options.transaction } : {}),
    ...(options.lock && options.transaction ? { lock: options.transaction.LOCK.UPDATE } : {}),
  });
}
