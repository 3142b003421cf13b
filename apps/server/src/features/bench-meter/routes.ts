import { Router } from 'express';
import {
  armBenchMeterRequest,
  benchMeterArmParams,
  benchMeterArmSchema,
  benchMeterNextQuery,
  benchMeterNextResponse,
  benchMeterReadingRequest,
  benchMeterRoles,
  benchMeterStatusQuery,
  benchMeterStatusResponse,
  idParams,
  type CreateReadingResponse,
} from '@splitscope/contract';
import { actorOf, requireRole } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { MeterDesk } from './desk';
import { armBenchMeter, benchMeterStatus, cancelBenchMeter, nextBenchMeterJob, takeBenchMeterReading } from './service';

/**
 * The bench page asks for a reading from the bench meter (`/jobs/:id/bench-meter`); the bridge beside the meter,
 * signed in as the same person, waits for the request (`/bench-meter/next`) and sends the meter's answer back.
 */
export function benchMeterRoutes(ctx: AppContext): Router {
  const desk = new MeterDesk();
  const r = Router();
  const guard = requireRole(...benchMeterRoles);
  r.get('/jobs/:id/bench-meter', guard, async (req, res) => {
    const { id } = parse(idParams, req.params);
    const { since, wait } = parse(benchMeterStatusQuery, req.query);
    const hangUp = new AbortController();
    res.on('close', () => hangUp.abort());
    const status = await benchMeterStatus({ db: ctx.db, desk, actor: actorOf(req), jobId: id, since, waitMs: wait * 1000, signal: hangUp.signal });
    if (!res.writableEnded && !hangUp.signal.aborted) res.json(benchMeterStatusResponse.parse(status));
  });
  r.post('/jobs/:id/bench-meter', guard, async (req, res) => {
    const { id } = parse(idParams, req.params);
    const input = parse(armBenchMeterRequest, req.body);
    res.status(201).json(benchMeterArmSchema.parse(await armBenchMeter({ db: ctx.db, desk, actor: actorOf(req), jobId: id, input })));
  });
  r.delete('/jobs/:id/bench-meter', guard, async (req, res) => {
    const { id } = parse(idParams, req.params);
    res.json(benchMeterStatusResponse.parse(await cancelBenchMeter({ db: ctx.db, desk, actor: actorOf(req), jobId: id })));
  });
  r.get('/bench-meter/next', guard, async (req, res) => {
    const { after, wait, instrument } = parse(benchMeterNextQuery, req.query);
    // The long poll ends early when the bridge hangs up (the response's close: the request's fires once it is read).
    const hangUp = new AbortController();
    res.on('close', () => hangUp.abort());
    const request = await nextBenchMeterJob({ desk, actor: actorOf(req), after, waitMs: wait * 1000, instrument, signal: hangUp.signal });
    if (!res.writableEnded && !hangUp.signal.aborted) res.json(benchMeterNextResponse.parse({ request }));
  });
  r.post('/bench-meter/requests/:armId/reading', guard, async (req, res) => {
    const { armId } = parse(benchMeterArmParams, req.params);
    const input = parse(benchMeterReadingRequest, req.body);
    const body: CreateReadingResponse = await takeBenchMeterReading({ db: ctx.db, desk, actor: actorOf(req), armId, input });
    res.status(201).json(body);
  });
  return r;
}
