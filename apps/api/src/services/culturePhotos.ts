import type { Actor } from './cultureAccess';
import { loadCultureForEdit, loadCultureForView } from './cultureAccess';
import { deletePhotoRow, findEventById, findPhoto, insertPhoto, listPhotosOfCulture } from '../db/queries/cultures';
import { processPhoto } from '../lib/images';
import { newId } from '../lib/ids';
import { notFound, validationFailed } from '../lib/errors';
import type { ObjectStorage } from '../storage';
import type { ServiceContext } from './context';

export async function addCulturePhoto(
  ctx: ServiceContext,
  storage: ObjectStorage,
  actor: Actor,
  cultureId: string,
  input: { file: Buffer; caption: string; eventId?: string },
) {
  const culture = await loadCultureForEdit(ctx.db, actor, cultureId);
  if (input.eventId) {
    const event = await findEventById(ctx.db, input.eventId);
    if (!event || event.cultureId !== culture.id) {
      throw validationFailed({ 'body.eventId': ['No entry in this culture’s log has this id'] });
    }
  }
  const photo = await processPhoto(input.file);
  const id = newId();
  const webKey = `cultures/${culture.id}/${id}-web.webp`;
  const thumbKey = `cultures/${culture.id}/${id}-thumb.webp`;
  await storage.put(webKey, photo.web.data, photo.contentType);
  await storage.put(thumbKey, photo.thumb.data, photo.contentType);
  try {
    return await insertPhoto(ctx.db, {
      id,
      cultureId: culture.id,
      eventId: input.eventId ?? null,
      uploadedBy: actor.id,
      caption: input.caption,
      webKey,
      thumbKey,
      contentType: photo.contentType,
      width: photo.web.width,
      height: photo.web.height,
      bytes: photo.web.data.length,
    });
  } catch (err) {
    await Promise.allSettled([storage.delete(webKey), storage.delete(thumbKey)]);
    throw err;
  }
}

export async function listCulturePhotos(ctx: ServiceContext, actor: Actor, cultureId: string) {
  await loadCultureForView(ctx.db, actor, cultureId);
  return listPhotosOfCulture(ctx.db, cultureId);
}

/** Only someone who may see the culture gets the bytes; there are no public object URLs. */
export async function readCulturePhoto(
  ctx: ServiceContext,
  storage: ObjectStorage,
  actor: Actor,
  cultureId: string,
  photoId: string,
  variant: 'web' | 'thumb',
) {
  await loadCultureForView(ctx.db, actor, cultureId);
  const photo = await findPhoto(ctx.db, cultureId, photoId);
  if (!photo) throw notFound('This photo');
  const body = await storage.get(variant === 'web' ? photo.webKey : photo.thumbKey);
  if (!body) throw notFound('This photo');
  return { body, contentType: photo.contentType };
}

export async function deleteCulturePhoto(
  ctx: ServiceContext,
  storage: ObjectStorage,
  actor: Actor,
  cultureId: string,
  photoId: string,
) {
  await loadCultureForEdit(ctx.db, actor, cultureId);
  const photo = await findPhoto(ctx.db, cultureId, photoId);
  if (!photo) throw notFound('This photo');
  await deletePhotoRow(ctx.db, photo.id);
  await Promise.allSettled([storage.delete(photo.webKey), storage.delete(photo.thumbKey)]);
}
