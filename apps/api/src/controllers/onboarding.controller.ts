// Handlers for a partner's application and documents under /orgs/:orgId (org guard ran first).
import { pipeline } from 'node:stream/promises';
import type { Response } from 'express';
import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { AreaStepSchema, BusinessStepSchema, CapabilitiesStep, DocumentKind } from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { Actor } from '../lib/context';
import { NotFound } from '../lib/errors';
import * as onboarding from '../services/onboarding.service';
import { StoredFileMissing } from '../storage';

/** `inline` with an ASCII fallback name and the exact name in RFC 5987 encoding. */
export function inlineDisposition(fileName: string): string {
  const fallback = fileName.replace(/[^\x20-\x7e]|["\\%]/g, '_');
  const encoded = encodeURIComponent(fileName).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
  return `inline; filename="${fallback}"; filename*=UTF-8''${encoded}`;
}

export function onboardingController({ dataSource, storage, config, logger }: AppContext) {
  const tx = <T>(actor: Actor, fn: (ctx: { manager: EntityManager; actor: Actor }) => Promise<T>) => dataSource.transaction((manager) => fn({ manager, actor }));
  const read = (actor: Actor) => ({ manager: dataSource.manager, actor });
  const publicUrl = config.publicUrl;
  const today = () => onboarding.todayUtc();
  const forget = (storageKey: string) =>
    storage.delete(storageKey).catch((err: unknown) => logger.error({ storageKey, error: (err as Error).message }, 'could not remove a stored file'));

  return {
    getApplication: async ({ actor }: { actor: Actor }) => ({ data: await onboarding.getApplication(read(actor), today()) }),
    saveBusiness: async ({ body, actor }: { body: z.output<typeof BusinessStepSchema>; actor: Actor }) => ({
      data: await tx(actor, (ctx) => onboarding.saveBusiness(ctx, body, today())),
    }),
    saveArea: async ({ body, actor }: { body: z.output<typeof AreaStepSchema>; actor: Actor }) => ({
      data: await tx(actor, (ctx) => onboarding.saveArea(ctx, body, today())),
    }),
    saveCapabilities: async ({ body, actor }: { body: CapabilitiesStep; actor: Actor }) => ({
      data: await tx(actor, (ctx) => onboarding.saveCapabilities(ctx, body, today())),
    }),
    submit: async ({ actor }: { actor: Actor }) => ({
      data: await tx(actor, (ctx) => onboarding.submitApplication(ctx, { today: today(), publicUrl })),
    }),

    upload: async ({ body, file, actor }: { body: { kind: DocumentKind; expiresOn?: string; capabilityCode?: string }; file: Express.Multer.File | undefined; actor: Actor }) => {
      const sniffed = await onboarding.sniffUpload(file!.buffer);
      // stored first, recorded second: if recording fails the file goes again, so no file is
      // left without a row and no row without a file
      const storageKey = await storage.put(file!.buffer);
      try {
        const fileName = onboarding.sanitiseFileName(file!.originalname, sniffed.contentType);
        return { data: await tx(actor, (ctx) => onboarding.addDocument(ctx, { ...body, ...sniffed, fileName, storageKey }, { publicUrl })) };
      } catch (err) {
        await forget(storageKey);
        throw err;
      }
    },

    downloadFile: async ({ params, actor, res }: { params: { documentId: string }; actor: Actor; res: Response }) => {
      const doc = await onboarding.findDocument(read(actor), params.documentId);
      const stream = await storage.get(doc.storageKey).catch((err: unknown) => {
        if (err instanceof StoredFileMissing) {
          logger.error({ documentId: doc.id }, 'a document has no stored file');
          throw NotFound('The file of this document is missing.');
        }
        throw err;
      });
      res.status(200).set({
        'content-type': doc.contentType,
        'content-length': String(doc.sizeBytes),
        'content-disposition': inlineDisposition(doc.fileName),
        'x-content-type-options': 'nosniff',
        'cache-control': 'private, no-store',
      });
      try {
        await pipeline(stream, res);
      } catch (err) {
        // the headers are gone; all that is left is to end the connection
        logger.warn({ documentId: doc.id, error: (err as Error).message }, 'streaming a document was interrupted');
        res.destroy();
      }
    },

    deleteDocument: async ({ params, actor }: { params: { documentId: string }; actor: Actor }) => {
      const storageKey = await tx(actor, (ctx) => onboarding.deleteDocument(ctx, params.documentId));
      await forget(storageKey);
      return { data: { deleted: true as const } };
    },
  };
}
