import { Router } from 'express';
import { listKits } from '@revloop/db';
import { dayRangeQuerySchema, kitCreateSchema, kitPatchSchema } from '@revloop/contract';
import type { AppDeps } from '../../context';
import { authorize, requireShop } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { singleFileUpload } from '../../storage/upload';
import { addKitPhoto, KIT_PHOTO_MAX_BYTES, kitPhotoFile, removeKitPhoto } from './kit-photos.service';
import { createKit, kitCalendar, kitDetail, kitOverview, patchKit, presentKit } from './kit.service';

export function createKitsRouter(deps: AppDeps): Router {
  const router = Router();

  router.get('/', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'read', 'Kit');
    const rows = await listKits(deps.db, auth.shop.id, { includeRetired: auth.ability.can('book', 'Rental') });
    res.json({ data: rows.map((r) => presentKit(r, auth.shop.currency)), meta: { total: rows.length } });
  });

  router.post('/', async (req, res) => {
    const auth = requireShop(req);
    const row = await createKit(deps, auth, parseInput(kitCreateSchema, req.body));
    res.status(201).json({ data: presentKit(row, auth.shop.currency) });
  });

  router.get('/overview', async (req, res) => {
    const auth = requireShop(req);
    res.json({ data: await kitOverview(deps, auth, parseInput(dayRangeQuerySchema, req.query)) });
  });

  router.get('/:id', async (req, res) => {
    const auth = requireShop(req);
    res.json({ data: await kitDetail(deps, auth, req.params.id) });
  });

  router.patch('/:id', async (req, res) => {
    const auth = requireShop(req);
    const row = await patchKit(deps, auth, req.params.id, parseInput(kitPatchSchema, req.body));
    res.json({ data: presentKit(row, auth.shop.currency) });
  });

  router.get('/:id/bookings', async (req, res) => {
    const auth = requireShop(req);
    res.json({ data: await kitCalendar(deps, auth, req.params.id, parseInput(dayRangeQuerySchema, req.query)) });
  });

  // Photos (optional): the upload streams to a temporary file; the service checks it is an image, then stores it.
  router.post('/:id/photos', singleFileUpload(deps.blobs, 'file', () => KIT_PHOTO_MAX_BYTES), async (req, res) => {
    const auth = requireShop(req);
    res.status(201).json({ data: await addKitPhoto(deps, auth, req.params.id as string, req.file) });
  });

  router.get('/:id/photos/:photoId', async (req, res) => {
    const auth = requireShop(req);
    const photo = await kitPhotoFile(deps, auth, req.params.id, req.params.photoId);
    res.set('Content-Type', photo.content_type).set('Cache-Control', 'private, max-age=3600').set('X-Content-Type-Options', 'nosniff');
    (await deps.blobs.stream(photo.sha256)).on('error', () => res.destroy()).pipe(res);
  });

  router.delete('/:id/photos/:photoId', async (req, res) => {
    const auth = requireShop(req);
    await removeKitPhoto(deps, auth, req.params.id, req.params.photoId);
    res.status(204).end();
  });

  return router;
}
