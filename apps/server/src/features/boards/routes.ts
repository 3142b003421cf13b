import { Router } from 'express';
import {
  boardDetailQuery,
  boardDetailSchema,
  boardListResponse,
  boardVersionListResponse,
  correctBoardVersionRequest,
  createBoardRequest,
  createFaultCodeRequest,
  faultCodeListQuery,
  faultCodeListResponse,
  faultCodeSchema,
  idParams,
  updateBoardRequest,
  updateFaultCodeRequest,
} from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import {
  correctBoardVersion,
  createBoard,
  createFaultCode,
  deleteFaultCode,
  findBoards,
  findBoardVersions,
  findFaultCodes,
  getBoard,
  getBoardDrawing,
  updateBoard,
  updateFaultCode,
} from './service';

/**
 * `onPublished` runs after a version is stored (app.ts starts the diagnosis feature's fault dictionary there). It
 * is handed in rather than imported: diagnosis uses the boards feature, so boards importing diagnosis back would
 * make the two features a cycle.
 */
export function boardRoutes(ctx: AppContext, onPublished: (versionId: string) => void): Router {
  const r = Router();
  r.get('/boards', requireRole(...ROLES.everyone), async (req, res) => {
    res.json(boardListResponse.parse(await findBoards({ db: ctx.db, shopId: actorOf(req).shopId })));
  });
  // The admin keeps the library; leads edit the models in it.
  r.post('/boards', requireRole(...ROLES.admins), async (req, res) => {
    const { document, note } = parse(createBoardRequest, req.body);
    const board = await createBoard({ db: ctx.db, actor: actorOf(req), document, note });
    res.status(201).json(boardDetailSchema.parse(board));
    onPublished(board.versionId);
  });
  r.get('/boards/:id', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const { version } = parse(boardDetailQuery, req.query);
    res.json(boardDetailSchema.parse(await getBoard({ db: ctx.db, shopId: actorOf(req).shopId, id, version })));
  });
  r.patch('/boards/:id', requireRole(...ROLES.reviewers), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const { document, note } = parse(updateBoardRequest, req.body);
    const board = await updateBoard({ db: ctx.db, actor: actorOf(req), id, document, note });
    res.json(boardDetailSchema.parse(board));
    onPublished(board.versionId);
  });
  // A stored version the schema rejects is corrected in place by a lead (see correctBoardVersion).
  r.put('/boards/versions/:id/document', requireRole(...ROLES.reviewers), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const { document } = parse(correctBoardVersionRequest, req.body);
    const board = await correctBoardVersion({ db: ctx.db, actor: actorOf(req), versionId: id, document });
    res.json(boardDetailSchema.parse(board));
    onPublished(board.versionId);
  });
  r.get('/boards/:id/versions', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    res.json(boardVersionListResponse.parse(await findBoardVersions({ db: ctx.db, shopId: actorOf(req).shopId, id })));
  });
  // The drawing is made by the board library from the stored composition; no client-sent SVG is ever served.
  r.get('/boards/versions/:id/picture', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const svg = await getBoardDrawing({ db: ctx.db, shopId: actorOf(req).shopId, versionId: id });
    res.setHeader('Cache-Control', 'private, max-age=86400, immutable');
    res.setHeader('Content-Security-Policy', "default-src 'none'; style-src 'unsafe-inline'; sandbox");
    res.type('image/svg+xml').send(svg);
  });
  r.get('/fault-codes', requireRole(...ROLES.everyone), async (req, res) => {
    const { boardId } = parse(faultCodeListQuery, req.query);
    res.json(faultCodeListResponse.parse(await findFaultCodes({ db: ctx.db, shopId: actorOf(req).shopId, boardId })));
  });
  r.post('/fault-codes', requireRole(...ROLES.reviewers), async (req, res) => {
    const input = parse(createFaultCodeRequest, req.body);
    res.status(201).json(faultCodeSchema.parse(await createFaultCode({ db: ctx.db, shopId: actorOf(req).shopId, input })));
  });
  // The shop's code table is the leads' to keep, like the board models it points into.
  r.put('/fault-codes/:id', requireRole(...ROLES.reviewers), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const input = parse(updateFaultCodeRequest, req.body);
    res.json(faultCodeSchema.parse(await updateFaultCode({ db: ctx.db, shopId: actorOf(req).shopId, id, input })));
  });
  r.delete('/fault-codes/:id', requireRole(...ROLES.reviewers), async (req, res) => {
    const { id } = parse(idParams, req.params);
    await deleteFaultCode({ db: ctx.db, shopId: actorOf(req).shopId, id });
    res.status(204).end();
  });
  return r;
}
