import { Router } from 'express';
import type { Request } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import {
  customerInputSchema,
  linePriceSchema,
  orderInputSchema,
  orderLineInputSchema,
  orderListQuerySchema,
  orderMoveSchema,
  orderParamsSchema,
  refundInputSchema,
} from '@shared/schemas/orders';
import { idSchema, teamParamsSchema } from '@shared/schemas/team';
import { can } from '@shared/permissions';
import type { Env } from '../../config/env';
import { forbidden } from '../../lib/errors';
import { requirePermission, teamScope } from '../../middleware/auth';
import { route } from '../../middleware/validate';
import type { OrderActor, OrdersService } from './orders.service';
import type { PaymentsService } from './payments.service';
import type { ProofsService } from './proofs.service';
import type { OrderProduction } from './production';

const lineParams = orderParamsSchema.extend({ lineId: idSchema });
const proofSendSchema = z.object({ message: z.string().trim().max(2000, 'Use at most 2000 characters').default('') });

/** Buyers and their orders, for members: quotes, lines, proofs, payments and production steps. */
export function ordersRouter(deps: {
  dataSource: DataSource;
  orders: OrdersService;
  proofs: ProofsService;
  payments: PaymentsService;
  production: OrderProduction;
  env: Pick<Env, 'appUrl'>;
}): Router {
  const { orders, proofs, payments } = deps;
  const router = Router();
  const scoped = teamScope(deps.dataSource);
  const view = requirePermission('orders.view');
  const quote = requirePermission('orders.quote');
  const pay = requirePermission('orders.payments');
  const actor = (req: Request): OrderActor => ({
    userId: req.user!.id,
    name: req.user!.name,
    teamId: req.membership!.teamId,
    role: req.membership!.role,
    unit: req.user!.unit,
  });
  const created = <T>(res: { status: (n: number) => unknown }, value: T) => (res.status(201), value);

  router.get(
    '/teams/:teamId/customers',
    scoped,
    view,
    route({ params: teamParamsSchema }, async (_i, req) => ({ customers: await orders.customers(actor(req).teamId) })),
  );
  router.post(
    '/teams/:teamId/customers',
    scoped,
    quote,
    route({ params: teamParamsSchema, body: customerInputSchema }, async ({ body }, req, res) =>
      created(res, await orders.addCustomer(actor(req).teamId, body)),
    ),
  );

  router.get(
    '/teams/:teamId/orders',
    scoped,
    view,
    route({ params: teamParamsSchema, query: orderListQuerySchema }, ({ query }, req) => orders.board(actor(req), query)),
  );
  router.post(
    '/teams/:teamId/orders',
    scoped,
    quote,
    route({ params: teamParamsSchema, body: orderInputSchema }, async ({ body }, req, res) =>
      created(res, await orders.create(actor(req), body)),
    ),
  );
  router.get(
    '/teams/:teamId/orders/:orderId',
    scoped,
    view,
    route({ params: orderParamsSchema }, ({ params }, req) => orders.view(actor(req), params.orderId)),
  );
  router.get(
    '/teams/:teamId/orders/:orderId/proofs/:proofId/pictures/:index.png',
    scoped,
    view,
    route(
      { params: orderParamsSchema.extend({ proofId: idSchema, index: z.coerce.number().int().min(0).max(999) }) },
      async ({ params }, req, res) => {
        res
          .type('png')
          .set('Cache-Control', 'private, max-age=86400')
          .send(await proofs.memberPicture(actor(req).teamId, params.orderId, params.proofId, params.index));
      },
    ),
  );
  router.post(
    '/teams/:teamId/orders/:orderId/lines',
    scoped,
    quote,
    route({ params: orderParamsSchema, body: orderLineInputSchema }, async ({ params, body }, req, res) =>
      created(res, await orders.addLine(actor(req), params.orderId, body)),
    ),
  );
  router.put(
    '/teams/:teamId/orders/:orderId/lines/:lineId/price',
    scoped,
    quote,
    route({ params: lineParams, body: linePriceSchema }, ({ params, body }, req) =>
      orders.setLinePrice(actor(req), params.orderId, params.lineId, body.unitPrice),
    ),
  );
  router.delete(
    '/teams/:teamId/orders/:orderId/lines/:lineId',
    scoped,
    quote,
    route({ params: lineParams }, ({ params }, req) => orders.removeLine(actor(req), params.orderId, params.lineId)),
  );
  router.post(
    '/teams/:teamId/orders/:orderId/moves',
    scoped,
    quote,
    route({ params: orderParamsSchema, body: orderMoveSchema }, ({ params, body }, req) =>
      orders.move(actor(req), params.orderId, body.to, body.note),
    ),
  );
  router.post(
    '/teams/:teamId/orders/:orderId/proofs',
    scoped,
    quote,
    route({ params: orderParamsSchema, body: proofSendSchema }, async ({ params, body }, req, res) =>
      created(res, {
        ...(await proofs.send(actor(req), params.orderId, body.message)),
        order: await orders.view(actor(req), params.orderId),
      }),
    ),
  );
  router.post(
    '/teams/:teamId/orders/:orderId/sheets',
    scoped,
    quote,
    requirePermission('sheets.edit'),
    route({ params: orderParamsSchema }, async ({ params }, req, res) => {
      const made = await deps.production.makeSheets(actor(req), params.orderId);
      return created(res, { ...made, order: await orders.view(actor(req), params.orderId) });
    }),
  );
  router.post(
    '/teams/:teamId/orders/:orderId/payment-link',
    scoped,
    pay,
    route({ params: orderParamsSchema }, async ({ params }, req, res) =>
      created(res, await payments.emailPaymentLink(actor(req), params.orderId, `${deps.env.appUrl}/paid`)),
    ),
  );
  router.post(
    '/teams/:teamId/orders/:orderId/refunds',
    scoped,
    pay,
    route({ params: orderParamsSchema, body: refundInputSchema }, ({ params, body }, req) => {
      if (!can(req.membership!.role, 'orders.money')) throw forbidden();
      return payments.refund(actor(req), params.orderId, body.amount, body.reason);
    }),
  );
  return router;
}
