/**
 * CASL rules → Sequelize `where` (architecture.md): `rulesToCondition` from
 * @casl/ability/extra walks the rules in priority order; each rule's Mongo-style
 * conditions become Sequelize operators, `cannot` rules are negated here.
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

/** Converts one rule's Mongo-style conditions; throws on an operator we do not translate. */
export function mongoToSequelize(conditions: Record<string, unknown>): Record<string | symbol, unknown> {
  const out: Record<string | symbol, unknown> = {};
  for (const [field, value] of Object.entries(conditions)) {
    if (field === '$and' || field === '$or') {
      out[field === '$and' ? Op.and : Op.or] = (value as Record<string, unknown>[]).map(mongoToSequelize);
      continue;
    }
    if (value !== null && typeof value === 'object' && !Array.isArray(value) && !(value instanceof Date)) {
      const ops: Record<symbol, unknown> = {};
      for (const [op, operand] of Object.entries(value as Record<string, unknown>)) {
        const sym = OPS[op];
        if (!sym) throw new Error(`No Sequelize translation for condition operator ${op}`);
        ops[sym] = operand;
      }
      out[field] = ops;
    } else {
      out[field] = value;
    }
  }
  return out;
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
      const where = mongoToSequelize((rule.conditions ?? {}) as Record<string, unknown>);
      return rule.inverted ? { [Op.not]: where } : where;
    },
    {
      and: (conditions) => ({ [Op.and]: conditions }),
      or: (conditions) => (conditions.length === 1 ? (conditions[0] as WhereOptions) : { [Op.or]: conditions }),
      empty: () => ({}),
    },
  );
}
