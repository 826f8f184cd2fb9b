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
