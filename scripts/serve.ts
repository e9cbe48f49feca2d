// The HTTP server: Express with multer in front of Astro's Node handler
// (middleware mode). Uploads to POST /api/imports stream to a quarantine
// folder under DATA_DIR with size and count limits; everything else goes
// straight to Astro.
import express from 'express';
import multer from 'multer';
import fs from 'node:fs';
import path from 'node:path';
import crypto from 'node:crypto';
import type http from 'node:http';

export const CLIENT_IP_HEADER = 'x-ionotheca-client-address';

export interface UploadLimits {
  /** @default 25 MB */ fileBytes: number;
  /** @default 500 */ files: number;
  /** @default 500 MB */ totalBytes: number;
}

export function uploadLimits(): UploadLimits {
  const mb = (name: string, d: number) => Number(process.env[name] ?? d) * 1024 * 1024;
  return {
    fileBytes: mb('IMPORT_MAX_FILE_MB', 25),
    files: Number(process.env.IMPORT_MAX_FILES ?? 500),
    totalBytes: mb('IMPORT_MAX_TOTAL_MB', 500),
  };
}

function jsonError(res: express.Response, status: number, code: string, message: string) {
  res.status(status).type('application/json').send(JSON.stringify({ error: { code, message } }));
}

export async function createApp({ root, dataDir }: { root: string; dataDir: string }) {
  const entry = path.join(root, 'dist', 'server', 'entry.mjs');
  const { handler } = (await import(entry)) as { handler: (req: any, res: any, next?: any, locals?: any) => void };
  const quarantine = path.join(dataDir, 'quarantine');
  fs.mkdirSync(quarantine, { recursive: true });
  const limits = uploadLimits();

  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', false);
  // Astro's Request has no client address: hand it over in a header of our
  // own, overwriting whatever the client sent under that name.
  app.use((req, _res, next) => {
    req.headers[CLIENT_IP_HEADER] = req.socket.remoteAddress ?? 'unknown';
    next();
  });
  app.use(express.static(path.join(root, 'dist', 'client'), { index: false, maxAge: '1h', fallthrough: true }));

  const upload = multer({
    storage: multer.diskStorage({
      destination: quarantine,
      filename: (_req, _file, cb) => cb(null, `${Date.now()}-${crypto.randomUUID()}.upload`),
    }),
    limits: { fileSize: limits.fileBytes, files: limits.files, fields: 20, fieldSize: 1024 * 1024 },
  }).array('files', limits.files);

  app.post('/api/imports', (req, res, next) => {
    // Only callers who could be signed in get to write to disk; Astro checks the rest.
    if (!req.headers.cookie && !req.headers.authorization && !req.headers['x-api-key']) {
      return jsonError(res, 401, 'unauthenticated', 'Sign in first, or send an API key');
    }
    const declared = Number(req.headers['content-length'] ?? 0);
    if (declared > limits.totalBytes) {
      return jsonError(res, 413, 'total_size_limit', `The upload is over the total size limit of ${limits.totalBytes / 1048576} MB`);
    }
    upload(req, res, (err: any) => {
      const files = ((req.files as Express.Multer.File[]) ?? []).map((f) => ({ originalname: f.originalname, path: f.path, size: f.size }));
      const cleanup = () => {
        for (const f of files) fs.rm(f.path, { force: true }, () => {});
      };
      res.on('close', cleanup);
      let uploadError: { status: number; code: string; message: string } | null = null;
      if (err) {
        cleanup();
        if (err.code === 'LIMIT_FILE_SIZE') uploadError = { status: 413, code: 'file_size_limit', message: `A file is over the size limit of ${limits.fileBytes / 1048576} MB` };
        else if (err.code === 'LIMIT_FILE_COUNT' || err.code === 'LIMIT_UNEXPECTED_FILE')
          uploadError = err.code === 'LIMIT_FILE_COUNT'
            ? { status: 413, code: 'file_count_limit', message: `More than ${limits.files} files in one request` }
            : { status: 400, code: 'unexpected_field', message: `Send the files in the field "files" (got "${err.field}")` };
        else uploadError = { status: 400, code: 'bad_upload', message: `The upload could not be read: ${err.message}` };
      }
      // multer consumed the body: give Astro an empty one, or it fails with
      // "Response body object should not be disturbed or locked".
      const locals = { uploads: err ? [] : files, uploadFields: { ...(req.body ?? {}) }, uploadError };
      (req as any).body = { async *[Symbol.asyncIterator]() {} };
      handler(req, res, next, locals);
    });
  });

  // No next(): an unmatched path renders Astro's 404 page (JSON for /api/).
  app.use((req, res) => handler(req, res));
  app.use((err: any, _req: express.Request, res: express.Response, _next: express.NextFunction) => {
    console.error('[server] unexpected error:', err?.message ?? err);
    if (!res.headersSent) jsonError(res, 500, 'internal_error', 'Something went wrong on the server');
  });
  return app;
}

export function listen(app: express.Express, host: string, port: number): Promise<http.Server> {
  return new Promise((resolve, reject) => {
    const server = app.listen(port, host);
    server.once('listening', () => resolve(server));
    server.once('error', (e: NodeJS.ErrnoException) => {
      if (e.code === 'EADDRINUSE') reject(new Error(`PORT ${port} on ${host} is already in use. Stop the other program or set PORT.`));
      else if (e.code === 'EACCES') reject(new Error(`PORT ${port} on ${host} may not be used by this user. Choose a PORT above 1024.`));
      else reject(e);
    });
  });
}
