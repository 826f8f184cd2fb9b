import { rulesToAST } from '@casl/ability/extra';
import { Op, literal, type ModelStatic, type Model, type WhereOptions } from 'sequelize';
import type { Action, AppAbility, SubjectName } from '@kerfline/domain/authz/ability';

/** The parts of a ucast condition we read (CompoundCondition and FieldCondition share this shape). */
type AstNode = { operator: string; value: unknown; field?: string };

const TRUE = literal('TRUE');
const FALSE = literal('FALSE');

/**
 * Turns the CASL rules for (action, subject) into a Sequelize `where` that returns exactly the rows
 * `ability.can(action, row)` allows. Supports `$eq`, `$ne`, `$in`, `$nin` on the model's own attributes and
 * throws on anything else, so a rule that cannot be translated fails loudly instead of leaking rows.
 *
 * Each leaf is built so it is never SQL NULL (CASL's `$ne`/`$nin` match NULLs; `col = v` would be NULL),
 * which keeps `NOT` correct for rows with NULL columns.
 */
export function scopeWhere(
  ability: AppAbility,
  action: Action,
  subject: SubjectName,
  model: ModelStatic<Model>,
): WhereOptions {
  const ast = rulesToAST(ability, action, subject) as AstNode | null;
  // null means no rule grants access at all: the easiest leak to write is treating it as "no filter".
  if (ast === null) return FALSE;
  return toWhere(ast, new Set(Object.keys(model.getAttributes())), subject);
}

function toWhere(node: AstNode, attributes: Set<string>, subject: string): WhereOptions {
  if (node.field === undefined) {
    const children = node.value as AstNode[];
    switch (node.operator) {
      case 'and':
        return children.length === 0 ? TRUE : { [Op.and]: children.map((c) => toWhere(c, attributes, subject)) };
      case 'or':
        return children.length === 0 ? FALSE : { [Op.or]: children.map((c) => toWhere(c, attributes, subject)) };
      case 'not': {
        const [only] = children.length === undefined ? [node.value as AstNode] : children;
        if (!only) throw new Error(`CASL 'not' without a condition on ${subject}`);
        return not(toWhere(only, attributes, subject));
      }
      default:
        throw new Error(`Unsupported CASL compound operator '${node.operator}' on ${subject}`);
    }
  }

  const field = node.field;
  if (!attributes.has(field))
    throw new Error(`CASL rule on ${subject} uses '${field}', which is not a column of the model`);
  switch (node.operator) {
    case 'eq':
      return equals(field, node.value);
    case 'ne':
      return not(equals(field, node.value));
    case 'in':
      return inList(field, asList(node.value, subject));
    case 'nin':
      return not(inList(field, asList(node.value, subject)));
    default:
      throw new Error(`Unsupported CASL operator '${node.operator}' on ${subject}.${field}; use $eq, $ne, $in or $nin`);
  }
}

/** Negation that folds the constants: Sequelize renders `Op.not` around a literal incorrectly. */
function not(where: WhereOptions): WhereOptions {
  if (where === TRUE) return FALSE;
  if (where === FALSE) return TRUE;
  return { [Op.not]: where };
}

function assertScalar(value: unknown, field: string): void {
  if (value !== null && typeof value === 'object')
    throw new Error(`CASL condition on '${field}' compares with an object`);
}

function equals(field: string, value: unknown): WhereOptions {
  assertScalar(value, field);
  if (value === null || value === undefined) return { [field]: { [Op.is]: null } };
  return { [Op.and]: [{ [field]: { [Op.ne]: null } }, { [field]: value }] };
}

function inList(field: string, values: unknown[]): WhereOptions {
  values.forEach((v) => assertScalar(v, field));
  const present = values.filter((v) => v !== null && v !== undefined);
  const parts: WhereOptions[] = [];
  // `IN ()` renders as `IN (NULL)`: fold an empty list to FALSE instead.
  if (present.length > 0) parts.push({ [Op.and]: [{ [field]: { [Op.ne]: null } }, { [field]: { [Op.in]: present } }] });
  if (present.length < values.length) parts.push({ [field]: { [Op.is]: null } });
  if (parts.length === 0) return FALSE;
  return parts.length === 1 ? parts[0]! : { [Op.or]: parts };
}

function asList(value: unknown, subject: string): unknown[] {
  if (!Array.isArray(value)) throw new Error(`CASL $in/$nin on ${subject} needs a list`);
  return value;
}

/** The scope AND a caller's own filter; the scope can never be dropped by passing an empty filter. */
export function scopedWhere(
  ability: AppAbility,
  action: Action,
  subject: SubjectName,
  model: ModelStatic<Model>,
  filter: WhereOptions = {},
): WhereOptions {
  return { [Op.and]: [scopeWhere(ability, action, subject, model), filter] };
}

/**
 * Bound parameters for a hand-written SQL statement: `add(value)` returns its placeholder (`$1`, `$2`, …) and
 * `values` goes to `sequelize.query(sql, { bind: values })`, so no value is ever spliced into the SQL text.
 */
export class SqlParams {
  readonly values: unknown[] = [];
  add(value: unknown): string {
    this.values.push(value);
    return `$${this.values.length}`;
  }
}

/**
 * The same CASL rules as `scopeWhere`, rendered as a SQL condition on the table aliased `alias`, with every value
 * bound through `params`: for the aggregate queries that Sequelize's finders cannot express (GROUP BY over
 * joins, LATERAL, percentiles). It walks the same AST with the same rules: `null` → FALSE, an empty `and` → TRUE,
 * each leaf never SQL NULL so `NOT` stays correct, and anything but `$eq`, `$ne`, `$in`, `$nin` on the model's
 * own columns throws. The parity test checks it row by row against `ability.can`, like `scopeWhere`.
 */
export function scopeSql(
  ability: AppAbility,
  action: Action,
  subject: SubjectName,
  model: ModelStatic<Model>,
  alias: string,
  params: SqlParams,
): string {
  if (!/^[a-z_][a-z0-9_]*$/.test(alias)) throw new Error(`Unsafe table alias '${alias}'`);
  const ast = rulesToAST(ability, action, subject) as AstNode | null;
  if (ast === null) return 'FALSE';
  const columns = new Map(Object.entries(model.getAttributes()).map(([name, attr]) => [name, attr.field ?? name]));
  return toSql(ast, columns, subject, alias, params);
}

function toSql(node: AstNode, columns: Map<string, string>, subject: string, alias: string, params: SqlParams): string {
  if (node.field === undefined) {
    const children = node.value as AstNode[];
    switch (node.operator) {
      case 'and':
        return children.length === 0
          ? 'TRUE'
          : `(${children.map((c) => toSql(c, columns, subject, alias, params)).join(' AND ')})`;
      case 'or':
        return children.length === 0
          ? 'FALSE'
          : `(${children.map((c) => toSql(c, columns, subject, alias, params)).join(' OR ')})`;
      case 'not': {
        const [only] = children.length === undefined ? [node.value as AstNode] : children;
        if (!only) throw new Error(`CASL 'not' without a condition on ${subject}`);
        return `(NOT ${toSql(only, columns, subject, alias, params)})`;
      }
      default:
        throw new Error(`Unsupported CASL compound operator '${node.operator}' on ${subject}`);
    }
  }
  const column = columns.get(node.field);
  if (column === undefined)
    throw new Error(`CASL rule on ${subject} uses '${node.field}', which is not a column of the model`);
  const col = `${alias}."${column}"`;
  const equalsSql = (value: unknown) => {
    assertScalar(value, node.field!);
    if (value === null || value === undefined) return `(${col} IS NULL)`;
    return `(${col} IS NOT NULL AND ${col} = ${params.add(value)})`;
  };
  const inSql = (values: unknown[]) => {
    values.forEach((v) => assertScalar(v, node.field!));
    const present = values.filter((v) => v !== null && v !== undefined);
    const parts: string[] = [];
    if (present.length > 0)
      parts.push(`(${col} IS NOT NULL AND ${col} IN (${present.map((v) => params.add(v)).join(', ')}))`);
    if (present.length < values.length) parts.push(`(${col} IS NULL)`);
    if (parts.length === 0) return 'FALSE';
    return parts.length === 1 ? parts[0]! : `(${parts.join(' OR ')})`;
  };
  switch (node.operator) {
    case 'eq':
      return equalsSql(node.value);
    case 'ne':
      return `(NOT ${equalsSql(node.value)})`;
    case 'in':
      return inSql(asList(node.value, subject));
    case 'nin':
      return `(NOT ${inSql(asList(node.value, subject))})`;
    default:
      throw new Error(
        `Unsupported CASL operator '${node.operator}' on ${subject}.${node.field}; use $eq, $ne, $in or $nin`,
      );
  }
}

/**
 * The model fields the caller's rules for (action, subject) look at. Empty when the rules grant everything or
 * nothing. A summary kept per site may stand in for its records only when this is at most `siteId`.
 */
export function scopeFields(ability: AppAbility, action: Action, subject: SubjectName): Set<string> {
  const fields = new Set<string>();
  const walk = (node: AstNode): void => {
    if (node.field !== undefined) {
      fields.add(node.field);
      return;
    }
    const value = node.value as AstNode | AstNode[];
    for (const child of Array.isArray(value) ? value : [value]) walk(child);
  };
  const ast = rulesToAST(ability, action, subject) as AstNode | null;
  if (ast !== null) walk(ast);
  return fields;
}
