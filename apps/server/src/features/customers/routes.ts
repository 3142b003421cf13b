import { Router } from 'express';
import {
  createCustomerRequest,
  customerListQuery,
  customerListResponse,
  customerSchema,
  idParams,
  mergeCustomerRequest,
  mergeCustomerResponse,
  updateCustomerRequest,
} from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { createCustomer, findCustomers, getCustomer, mergeCustomers, updateCustomer } from './service';

export function customerRoutes(ctx: AppContext): Router {
  const r = Router();
  r.get('/customers', requireRole(...ROLES.everyone), async (req, res) => {
    const query = parse(customerListQuery, req.query);
    res.json(customerListResponse.parse(await findCustomers({ db: ctx.db, shopId: actorOf(req).shopId, query })));
  });
  // Intake: whoever takes a board in at the counter may add its customer.
  r.post('/customers', requireRole(...ROLES.bench), async (req, res) => {
    const input = parse(createCustomerRequest, req.body);
    res.status(201).json(customerSchema.parse(await createCustomer({ db: ctx.db, shopId: actorOf(req).shopId, input })));
  });
  r.get('/customers/:id', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    res.json(customerSchema.parse(await getCustomer({ db: ctx.db, shopId: actorOf(req).shopId, id })));
  });
  r.patch('/customers/:id', requireRole(...ROLES.reviewers), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const input = parse(updateCustomerRequest, req.body);
    res.json(customerSchema.parse(await updateCustomer({ db: ctx.db, shopId: actorOf(req).shopId, id, input })));
  });
  r.post('/customers/:id/merge', requireRole(...ROLES.reviewers), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const { duplicateId } = parse(mergeCustomerRequest, req.body);
    res.json(mergeCustomerResponse.parse(await mergeCustomers({ db: ctx.db, actor: actorOf(req), keepId: id, duplicateId })));
  });
  return r;
}
