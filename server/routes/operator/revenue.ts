import { Router } from 'express';
import { Op } from 'sequelize';
import {
  MRR_STATES,
  currentMrrCents,
  firmsByState,
  mrrSeries,
  rowsInEffect,
  trialsEndingWithin,
  type SubscriptionHistoryRow,
} from '@domain/service-revenue';
import type { AppDeps } from '../../deps';
import { requireUser } from '../../middlewares/session-guard';
import { SubscriptionChange } from '../../models/SubscriptionChange';
import { Tenant } from '../../models/Tenant';
import { nowOf, requireAbility } from '../helpers';

/** Months in the MRR chart, the current one included. */
const SERIES_MONTHS = 12;
/** "Trials ending this week": the next 7 × 24 hours. */
const TRIAL_DAYS_AHEAD = 7;

/**
 * The operator's revenue view of the Mullion service: MRR now and month by month from the
 * subscription history, firms by state, trials about to end. Deliberately across firms
 * (`crossTenant`), and only firm-level numbers — never a firm's client records.
 */
export function operatorRevenueRouter(deps: AppDeps): Router {
  const router = Router();

  router.get('/operator/revenue', requireUser, requireAbility('read', 'OperatorConsole'), async (_req, res) => {
    const now = nowOf(deps);
    const changes = await SubscriptionChange.findAll({
      attributes: ['tenantId', 'planKey', 'state', 'monthlyAmountCents', 'from', 'createdAt'],
      where: { from: { [Op.lte]: now } },
      // the order the changes were stored in: of two with the same `from`, the later one wins
      order: [['createdAt', 'ASC']],
      crossTenant: true,
    });
    const rows: SubscriptionHistoryRow[] = changes.map((c) => ({
      tenantId: c.tenantId,
      planKey: c.planKey,
      state: c.state,
      monthlyAmountCents: c.monthlyAmountCents,
      from: c.from,
    }));
    const tenants = await Tenant.findAll({ attributes: ['id', 'name', 'state', 'trialEndsAt'], order: [['name', 'ASC']] });

    res.json({
      data: {
        mrrCents: currentMrrCents(rows, now),
        // firms whose subscription counts in MRR now (active or past due)
        activeSubscriptions: rowsInEffect(rows, now).filter((row) => MRR_STATES.includes(row.state)).length,
        firmsByState: firmsByState(tenants.map((t) => t.state)),
        trialsEndingThisWeek: trialsEndingWithin(tenants, now, TRIAL_DAYS_AHEAD).flatMap((t) =>
          t.trialEndsAt ? [{ id: t.id, name: t.name, trialEndsAt: t.trialEndsAt.toISOString() }] : [],
        ),
        series: mrrSeries(rows, { end: now, months: SERIES_MONTHS }),
      },
    });
  });

  return router;
}
