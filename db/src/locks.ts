import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';

/**
 * Takes a PostgreSQL transaction-level advisory lock on (`scope`, `key`), held until `transaction`
 * ends: writers of the same scope and key run one after another, across processes. Scopes name
 * what is serialised ("midgray.board"); keys say which one (a channel id).
 */
export async function lockUntilCommit(transaction: Transaction, scope: string, key: string): Promise<void> {
  const sequelize = (transaction as unknown as { sequelize: Sequelize }).sequelize;
  await sequelize.query('SELECT pg_advisory_xact_lock(hashtext(:scope), hashtext(:key))', { replacements: { scope, key }, type: QueryTypes.SELECT, transaction });
}
