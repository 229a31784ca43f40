import { Router } from 'express';
import { addDaysToDate } from '@domain/device-life';
import {
  activeContractCount,
  attritionRate,
  contractsCancelledBetween,
  contractsStartedBetween,
  monthlyRevenueSeries,
  recurringMonthlyRevenueCents,
  renewalsDueWithin,
  type MonitoringContract,
} from '@domain/contract-revenue';
import { scoped } from '../../context';
import type { AppDeps } from '../../deps';
import { Client } from '../../models/Client';
import { Site } from '../../models/Site';
import { todayIn } from '../../services/zones';
import { nowOf, requireAbility, requireFirm } from '../helpers';

/** The period of the "last 12 months" numbers and of the attrition rate. */
const PERIOD_MONTHS = 12;
/** Renewals listed: those due within this many days. */
const RENEWAL_DAYS = 90;

interface SiteContract extends MonitoringContract {
  siteId: string;
  siteName: string;
  clientId: string;
}

/**
 * The firm's own business numbers from its clients' monitoring contracts (product.md,
 * "Billing": "A firm dashboard shows its own RMR from client contracts and attrition"), for the
 * owner only. "Today" is the date in the firm's time zone.
 */
export function firmBusinessRouter(deps: AppDeps): Router {
  const router = Router();

  router.get('/firm/business', requireFirm, requireAbility('manage', 'Billing'), async (req, res) => {
    const ctx = req.ctx;
    const today = todayIn(ctx.tenant?.timeZone, nowOf(deps));
    const sites = await Site.findAll({
      where: scoped(ctx),
      attributes: ['id', 'name', 'clientId', 'contractStartsOn', 'contractTermMonths', 'contractMonthlyFeeCents', 'contractCancelledOn'],
      // a stable order, so renewals due on the same day list by site name
      order: [
        ['name', 'ASC'],
        ['id', 'ASC'],
      ],
    });
    const contracts: SiteContract[] = sites.map((site) => ({
      siteId: site.id,
      siteName: site.name,
      clientId: site.clientId,
      startsOn: site.contractStartsOn,
      termMonths: site.contractTermMonths,
      monthlyFeeCents: site.contractMonthlyFeeCents,
      cancelledOn: site.contractCancelledOn,
    }));

    const attrition = attritionRate(contracts, { periodEnd: today, months: PERIOD_MONTHS });
    // the same period as the attrition rate: after its start, up to and including today
    const periodFrom = addDaysToDate(attrition.periodStart, 1);
    const periodTo = addDaysToDate(today, 1);

    const renewals = renewalsDueWithin(contracts, today, RENEWAL_DAYS);
    const clientIds = [...new Set(renewals.map((r) => r.clientId))];
    const clients = clientIds.length ? await Client.findAll({ where: scoped(ctx, { id: clientIds }), attributes: ['id', 'name'] }) : [];
    const clientName = new Map(clients.map((c) => [c.id, c.name]));

    res.json({
      data: {
        today,
        rmrCents: recurringMonthlyRevenueCents(contracts, today),
        activeContracts: activeContractCount(contracts, today),
        newContracts12m: contractsStartedBetween(contracts, periodFrom, periodTo).length,
        cancelledContracts12m: contractsCancelledBetween(contracts, periodFrom, periodTo).length,
        attrition,
        renewals: renewals.map((r) => ({
          siteId: r.siteId,
          siteName: r.siteName,
          clientId: r.clientId,
          clientName: clientName.get(r.clientId) ?? '',
          renewsOn: r.renewsOn,
          monthlyFeeCents: r.monthlyFeeCents,
        })),
        series: monthlyRevenueSeries(contracts, { today, months: PERIOD_MONTHS }).map((p) => ({
          month: p.month,
          label: p.label,
          rmrCents: p.rmrCents,
          activeContracts: p.activeContracts,
        })),
      },
    });
  });

  return router;
}
