/**
 * CASL rules → Sequelize `where` (architecture.md): `rulesToCondition` from
 * @casl/ability/extra walks the rules in priority order; each rule's Mongo-style
 * conditions become Sequelize operators, `cannot` rules are negated here (NULL-safe, as
 * ability.can decides).
 */
import { rulesToCondition } from '@casl/ability/extra';
import { Op, type WhereOptions } from 'sequelize';
import type { Action, AppAbility, SubjectType } from '@domain/abilities';

const OPS: Record<string, symbol> = {
  $eq: Op.eq,
  $ne: Op.ne,
  $in: Op.in,
  $nin: Op.notIn,
  $gt: Op.gt,
  $gte: Op.gte,
  $lt: Op.lt,
  $lte: Op.lte,
};

/**
 * Converts one rule's Mongo-style conditions; throws on an operator we do not translate.
 *
 * CASL compares in JavaScript, where a missing value (null) differs from every value; SQL
 * compares NULL with nothing (the result is NULL, which neither matches nor, under NOT,
 * un-matches). So `$ne`/`$nin` also select NULL, and under a `cannot` (`negated`) each
 * comparison with a value is bounded by IS NOT NULL: every comparison is true or false,
 * and NOT of it keeps exactly the rows CASL keeps. CASL has no `$and`/`$or` in conditions
 * (it reads them as field names; alternatives are separate rules), so those are refused too.
 */
export function mongoToSequelize(conditions: Record<string, unknown>, { negated = false } = {}): Record<string | symbol, unknown> {
  const parts: Record<string | symbol, unknown>[] = [];
  for (const [field, value] of Object.entries(conditions)) {
    if (field.startsWith('$')) throw new Error(`No Sequelize translation for condition operator ${field}`);
    const isOps = value !== null && typeof value === 'object' && !Array.isArray(value) && !(value instanceof Date);
    const ops = isOps ? (value as Record<string, unknown>) : { $eq: value };
    for (const [op, operand] of Object.entries(ops)) {
      const sym = OPS[op];
      if (!sym) throw new Error(`No Sequelize translation for condition operator ${op}`);
      const comparison = { [field]: { [sym]: operand } };
      if (operand === null) parts.push(comparison); // IS NULL / IS NOT NULL are never NULL
      else if (op === '$ne' || op === '$nin') parts.push({ [Op.or]: [comparison, { [field]: null }] });
      else if (negated) parts.push({ [Op.and]: [comparison, { [field]: { [Op.ne]: null } }] });
      else parts.push(comparison);
    }
  }
  return parts.length === 0 ? {} : parts.length === 1 ? parts[0]! : { [Op.and]: parts };
}

/**
 * The `where` that selects exactly the rows the ability allows for this action, or `null`
 * when it allows none (answer an empty list).
 */
export function accessibleWhere(ability: AppAbility, action: Action, subjectType: SubjectType): WhereOptions | null {
  const rules = ability.rulesFor(action, subjectType);
  return rulesToCondition<AppAbility, WhereOptions, WhereOptions>(
    rules,
    (rule) => {
      const conditions = rule.conditions ?? {};
      return rule.inverted ? { [Op.not]: mongoToSequelize(conditions, { negated: true }) } : mongoToSequelize(conditions);
    },
    {
      and: (conditions) => ({ [Op.and]: conditions }),
      or: (conditions) => (conditions.length === 1 ? (conditions[0] as WhereOptions) : { [Op.or]: conditions }),
      empty: () => ({}),
    },
  );
}
