/**
 * The fail-closed tenancy rule (architecture.md, "Tenancy"): a find, count, bulk update or
 * bulk destroy on a firm-owned model — or an `include` of one — must name the firm in its
 * `where`, unless the call says `crossTenant: true` (operator console, scheduled jobs,
 * sign-in by e-mail). Anything else throws before SQL is sent.
 */
import { Op, type Model, type ModelStatic } from 'sequelize';

declare module 'sequelize' {
  interface Logging {
    /** A deliberate query across firms (operator console, scheduled jobs, sign-in). */
    crossTenant?: boolean;
  }
}

export class TenantScopeError extends Error {
  constructor(modelName: string, operation: string) {
    super(`Refused an unscoped ${operation} on ${modelName}: name the firm (tenantId) or mark the call crossTenant.`);
    this.name = 'TenantScopeError';
  }
}

const guarded = new WeakSet<object>();

export function isTenantGuarded(model: unknown): boolean {
  return typeof model === 'function' && guarded.has(model);
}

function isTenantValue(value: unknown): boolean {
  if (typeof value === 'string' && value.length > 0) return true;
  if (value && typeof value === 'object') {
    const v = value as Record<symbol, unknown>;
    const eq = v[Op.eq];
    if (typeof eq === 'string' && eq.length > 0) return true;
    const inList = v[Op.in];
    if (Array.isArray(inList) && inList.length > 0 && inList.every((x) => typeof x === 'string')) return true;
  }
  return false;
}

export function hasTenantCondition(where: unknown): boolean {
  if (!where || typeof where !== 'object') return false;
  const w = where as Record<string | symbol, unknown>;
  if ('tenantId' in w && isTenantValue(w.tenantId)) return true;
  const and = w[Op.and];
  if (Array.isArray(and)) return and.some(hasTenantCondition);
  if (and && typeof and === 'object') return hasTenantCondition(and);
  return false;
}

interface IncludeLike {
  model?: unknown;
  where?: unknown;
  include?: unknown;
}

function checkIncludes(include: unknown, operation: string): void {
  if (!include) return;
  const list = Array.isArray(include) ? (include as unknown[]) : [include];
  for (const item of list) {
    const inc: IncludeLike = typeof item === 'function' ? { model: item } : (item as IncludeLike);
    if (inc.model && isTenantGuarded(inc.model) && !hasTenantCondition(inc.where)) {
      throw new TenantScopeError((inc.model as { name: string }).name, `include in ${operation}`);
    }
    checkIncludes(inc.include, operation);
  }
}

interface QueryOptionsLike {
  where?: unknown;
  include?: unknown;
  crossTenant?: boolean;
}

/** Installs the guard hooks on a model whose rows belong to a firm. */
export function guardTenantScope(model: ModelStatic<Model>): void {
  guarded.add(model);
  const check = (operation: string) => (options: QueryOptionsLike) => {
    if (options.crossTenant) return;
    if (!hasTenantCondition(options.where)) throw new TenantScopeError(model.name, operation);
  };
  model.addHook('beforeFind', check('find'));
  model.addHook('beforeCount', check('count'));
  model.addHook('beforeBulkUpdate', check('update'));
  model.addHook('beforeBulkDestroy', check('destroy'));
}

/**
 * Installed on every model: an `include` of a firm-owned model must name the firm too,
 * whichever model the query starts from.
 */
export function guardIncludes(model: ModelStatic<Model>): void {
  model.addHook('beforeFindAfterExpandIncludeAll', (options: QueryOptionsLike) => {
    if (options.crossTenant) return;
    checkIncludes(options.include, 'find');
  });
  model.addHook('beforeCount', (options: QueryOptionsLike) => {
    if (options.crossTenant) return;
    checkIncludes(options.include, 'count');
  });
}
