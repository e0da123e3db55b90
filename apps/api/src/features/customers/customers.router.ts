import { Router } from 'express';
import { findCustomer, listCustomerMessages, listCustomerPayments, listCustomers, listVehicles } from '@revloop/db';
import { customerListQuerySchema, type CustomerDetail, type CustomerListResponse } from '@revloop/contract';
import { asSubject } from '@revloop/domain/auth';
import type { VehicleInput } from '@revloop/domain/vehicles';
import type { AppDeps } from '../../context';
import { authorize, authorizeRow, requireShop } from '../../http/auth-context';
import { parseInput } from '../../http/validate';

/** Customers of the shop, searched, sorted and paged by the server; a dealer sees only its own (the ability's scope). */
export function createCustomersRouter({ db }: AppDeps): Router {
  const router = Router();

  router.get('/', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'read', 'Customer');
    const q = parseInput(customerListQuerySchema, req.query);
    // The SQL twin of the ability: a dealer's Customer rule is scoped to its dealerId.
    const dealerId = auth.actor.role === 'dealer' ? (auth.actor.dealerId ?? '-') : undefined;
    const { rows, total } = await listCustomers(db, auth.shop.id, {
      q: q.q,
      dealerId,
      sort: q.sort,
      dir: q.dir,
      limit: q.pageSize,
      offset: (q.page - 1) * q.pageSize,
    });
    const body: CustomerListResponse = {
      data: rows.map((r) => ({
        id: r.user_id,
        name: r.name,
        email: r.email,
        status: r.status,
        dealer: r.dealer_id ? { id: r.dealer_id, name: r.dealer_name ?? '' } : null,
        since: r.since,
        vehicleCount: Number(r.vehicle_count),
        vehicles: r.vehicles,
        openJobs: Number(r.open_jobs),
        jobCount: Number(r.job_count),
        lastActivityAt: r.last_activity,
        paidMinor: Number(r.paid_minor),
        currency: auth.shop.currency,
      })),
      meta: { total, page: q.page, pageSize: q.pageSize, pageCount: Math.max(1, Math.ceil(total / q.pageSize)) },
    };
    res.json(body);
  });

  router.get('/:id', async (req, res) => {
    const auth = requireShop(req);
    const row = await findCustomer(db, auth.shop.id, req.params.id);
    authorizeRow(auth, 'read', 'Customer', row && { shopId: auth.shop.id, dealerId: row.dealer_id }, 'Customer not found.');
    const shopId = auth.shop.id;
    const [vehicles, payments, messages] = await Promise.all([
      listVehicles(db, shopId, { kind: 'shop' }, row!.user_id),
      listCustomerPayments(db, shopId, row!.user_id),
      listCustomerMessages(db, shopId, row!.user_id),
    ]);
    const onJob = (job: { dealer_id: string | null }) => ({ shopId, customerUserId: row!.user_id, dealerId: job.dealer_id });
    const visiblePayments = payments.filter((p) => auth.ability.can('read', asSubject('Payment', onJob(p))));
    const body: { data: CustomerDetail } = {
      data: {
        id: row!.user_id,
        name: row!.name,
        email: row!.email,
        status: row!.status,
        dealer: row!.dealer_id ? { id: row!.dealer_id, name: row!.dealer_name ?? '' } : null,
        since: row!.since,
        currency: auth.shop.currency,
        paidMinor: visiblePayments.filter((p) => p.status === 'paid').reduce((sum, p) => sum + p.amount_minor - Number(p.refunded_minor ?? 0), 0),
        vehicles: vehicles
          .filter((v) => auth.ability.can('read', asSubject('Vehicle', { shopId, ownerUserId: v.owner_user_id, dealerId: v.dealer_id })))
          .map((v) => ({ id: v.id, vin: v.vin, modelYear: v.model_year, description: v.description, engineFamily: (JSON.parse(v.spec) as VehicleInput).engine.family })),
        payments: visiblePayments.map((p) => ({
          id: p.id,
          jobId: p.job_id!,
          jobNumber: p.job_number,
          amountMinor: p.amount_minor,
          refundedMinor: Number(p.refunded_minor ?? 0),
          currency: p.currency,
          status: p.status,
          createdAt: p.created_at,
          paidAt: p.paid_at,
        })),
        messages: messages
          .filter((m) => auth.ability.can('read', asSubject('Message', onJob(m))))
          .map((m) => ({ id: m.id, jobId: m.job_id, jobNumber: m.job_number, author: { id: m.author_user_id, name: m.author_name }, body: m.body, createdAt: m.created_at })),
      },
    };
    res.json(body);
  });

  return router;
}
