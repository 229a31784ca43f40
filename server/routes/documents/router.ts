import { Router, type Request, type Response } from 'express';
import { Op, type WhereOptions } from 'sequelize';
import { subject } from '@domain/abilities';
import { DOCUMENT_MAX_BYTES, documentPatchSchema, documentSchema } from '@domain/schemas/document';
import { scoped } from '../../context';
import type { AppDeps } from '../../deps';
import { errors } from '../../errors';
import { singleUpload } from '../../middlewares/upload';
import { fieldsFromZod, inputOf, validate } from '../../middlewares/validate';
import { Document } from '../../models/Document';
import { Site } from '../../models/Site';
import { audienceOf } from '../../presenters/client';
import { presentDocument } from '../../presenters/document';
import { createDocument, deleteDocument, safeFileName, updateDocument } from '../../services/documents';
import { checkImageHeader } from '../../services/image-header';
import { sniffImage, sniffPdf } from '../../storage/tenant-files';
import { authorizeRecord, inTransaction, pageOf, requireFirm } from '../helpers';
import { sendStoredFile } from '../send-stored-file';
import { documentListQuery, documentParams, siteDocumentsParams } from './schema';

const SORTABLE = { createdAt: 'createdAt', title: 'title', kind: 'kind' } as const;
const MAX_MB = DOCUMENT_MAX_BYTES / (1024 * 1024);

function orderOf(sort: string | undefined): [string, 'ASC' | 'DESC'] {
  const key = (sort ?? '-createdAt').replace(/^-/, '');
  const column = SORTABLE[key as keyof typeof SORTABLE];
  if (!column) throw errors.validation(`sort: use one of ${Object.keys(SORTABLE).join(', ')}.`, { sort: 'Not a sortable field.' });
  return [column, (sort ?? '-createdAt').startsWith('-') ? 'DESC' : 'ASC'];
}

/**
 * Site documents (permits, contracts, certificates, photos, floor plans): uploaded through
 * the storage module, recognised by their content, shared with the client or internal.
 */
export function documentsRouter(deps: AppDeps): Router {
  const router = Router();
  router.use('/sites/:siteId/documents', requireFirm);
  router.use('/documents', requireFirm);
  /** Reads the multipart body into memory (nothing touches the disk); over the limit → 413, malformed → 400. */
  const readUpload = singleUpload({
    maxBytes: DOCUMENT_MAX_BYTES,
    tooLargeMessage: `A document may be at most ${MAX_MB} MB.`,
    what: 'the file',
    limits: { fields: 10, fieldSize: 4096, parts: 12 },
  });

  async function loadSite(req: Request, siteId: string): Promise<Site> {
    const site = await Site.findOne({ where: scoped(req.ctx, { id: siteId }) });
    if (!site) throw errors.notFound('site');
    authorizeRecord(req, 'read', 'Site', site.get({ plain: true }), 'site');
    return site;
  }

  async function loadDocument(req: Request, documentId: string): Promise<Document> {
    const doc = await Document.findOne({ where: scoped(req.ctx, { id: documentId }) });
    if (!doc) throw errors.notFound('document');
    return doc;
  }

  /** Rights on a readable site's documents: 403 for a role that may read the site but not these. */
  function authorizeDocuments(req: Request, action: 'read' | 'create', site: Site): void {
    const docs = subject('Document', { tenantId: site.tenantId, siteId: site.id });
    if (!req.ability.can(action, docs)) throw errors.forbidden();
  }

  router.get('/sites/:siteId/documents', validate({ params: siteDocumentsParams, query: documentListQuery }), async (req, res) => {
    const { params, query } = inputOf(req, { params: siteDocumentsParams, query: documentListQuery });
    const order = orderOf(query.sort);
    const site = await loadSite(req, params.siteId);
    authorizeDocuments(req, 'read', site);
    const conditions: WhereOptions[] = [scoped(req.ctx, { siteId: site.id })];
    if (query.q) {
      const text = `%${query.q}%`;
      conditions.push({ [Op.or]: [{ title: { [Op.like]: text } }, { originalName: { [Op.like]: text } }] });
    }
    const { rows, count } = await Document.findAndCountAll({
      where: { [Op.and]: conditions },
      order: [order, ['id', 'ASC']],
      limit: query.pageSize,
      offset: (query.page - 1) * query.pageSize,
    });
    const audience = audienceOf(req.user);
    res.json({ data: rows.map((d) => presentDocument(d, { audience })), page: pageOf(query.page, query.pageSize, count) });
  });

  router.post('/sites/:siteId/documents', validate({ params: siteDocumentsParams }), async (req: Request, res: Response) => {
    const { params } = inputOf(req, { params: siteDocumentsParams });
    // authorize before reading the upload
    const site = await loadSite(req, params.siteId);
    authorizeDocuments(req, 'create', site);
    await readUpload(req, res);

    const parsed = documentSchema.safeParse(req.body ?? {});
    const file = req.file;
    const fields = parsed.success ? {} : fieldsFromZod(parsed.error);
    if (!file || file.size === 0) fields.file = 'Choose a PDF, PNG, JPEG or WebP file to upload.';
    if (!parsed.success || !file || file.size === 0) {
      const first = Object.entries(fields)[0];
      throw errors.validation(first ? `${first[0]}: ${first[1]}` : 'Check the highlighted fields.', fields);
    }
    const type = sniffPdf(file.buffer) ?? sniffImage(file.buffer);
    if (!type) throw errors.unsupportedType('A document must be a PDF, PNG, JPEG or WebP file. This file’s content is none of those, whatever its name says.');
    // an image is shown in browsers and the portal: refuse from the header what is too large to decode
    if (type.contentType.startsWith('image/')) checkImageHeader(file.buffer, type.extension.toUpperCase());

    const fileId = await deps.files.save(site.tenantId, file.buffer, type.extension);
    try {
      const doc = await inTransaction(req, deps, (ctx) =>
        createDocument(
          ctx,
          site,
          { fileId, contentType: type.contentType, extension: type.extension, sizeBytes: file.size, originalName: safeFileName(file.originalname, type.extension) },
          parsed.data,
        ),
      );
      res.status(201).json({ data: presentDocument(doc, { audience: 'staff' }) });
    } catch (e) {
      await deps.files.remove(site.tenantId, fileId).catch(() => undefined);
      throw e;
    }
  });

  router.get('/documents/:documentId/file', validate({ params: documentParams }), async (req, res) => {
    const { params } = inputOf(req, { params: documentParams });
    const doc = await loadDocument(req, params.documentId);
    authorizeRecord(req, 'read', 'Document', doc.get({ plain: true }), 'document');
    await sendStoredFile(res, deps.files, {
      tenantId: doc.tenantId,
      fileId: doc.fileId,
      contentType: doc.contentType,
      what: 'document file',
      caching: 'no-store',
      downloadName: safeFileName(doc.originalName || doc.title, doc.fileId.split('.').pop() ?? 'bin'),
    });
  });

  router.patch('/documents/:documentId', validate({ params: documentParams, body: documentPatchSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: documentParams, body: documentPatchSchema });
    const doc = await loadDocument(req, params.documentId);
    authorizeRecord(req, 'update', 'Document', doc.get({ plain: true }), 'document');
    const updated = await inTransaction(req, deps, (ctx) => updateDocument(ctx, doc, body));
    res.json({ data: presentDocument(updated, { audience: 'staff' }) });
  });

  router.delete('/documents/:documentId', validate({ params: documentParams }), async (req, res) => {
    const { params } = inputOf(req, { params: documentParams });
    const doc = await loadDocument(req, params.documentId);
    authorizeRecord(req, 'delete', 'Document', doc.get({ plain: true }), 'document');
    await inTransaction(req, deps, (ctx) => deleteDocument(ctx, doc));
    await deps.files.remove(doc.tenantId, doc.fileId).catch(() => undefined);
    if (doc.thumbnailFileId) await deps.files.remove(doc.tenantId, doc.thumbnailFileId).catch(() => undefined);
    res.status(204).end();
  });

  return router;
}
