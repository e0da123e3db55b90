import { OperationNodeTransformer, type DataTypeNode, type Kysely, type KyselyPlugin, type PluginTransformQueryArgs, type PluginTransformResultArgs, type QueryResult, type RootOperationNode, type UnknownRow } from 'kysely';
import { dialectOf } from '../client';

// Where the two engines differ, a migration branches on `onPostgres(db)` and keeps SQLite's statements exactly as they
// were, so an existing SQLite database and a new one have the same schema.

export const onPostgres = (db: Kysely<any>): boolean => dialectOf(db) === 'postgres';

/**
 * SQLite's `integer` is 64-bit; PostgreSQL's is 32-bit, too small for epoch milliseconds and large sums. On PostgreSQL
 * the migrations' schema-builder `integer` columns become `bigint` (read back as numbers, see client.ts).
 */
class WideIntegers extends OperationNodeTransformer {
  protected override transformDataType(node: DataTypeNode): DataTypeNode {
    return node.dataType === 'integer' ? { ...node, dataType: 'bigint' } : node;
  }
}

export class PostgresSchemaPlugin implements KyselyPlugin {
  readonly #transformer = new WideIntegers();
  transformQuery(args: PluginTransformQueryArgs): RootOperationNode {
    return this.#transformer.transformNode(args.node);
  }
  transformResult(args: PluginTransformResultArgs): Promise<QueryResult<UnknownRow>> {
    return Promise.resolve(args.result);
  }
}
