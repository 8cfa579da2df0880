import http from 'node:http';
import type { AddressInfo } from 'node:net';

/**
 * A tiny S3-compatible server on loopback for tests and local runs: path-style PUT, GET, HEAD and
 * DELETE of objects in buckets it was told about. It insists on a SigV4 Authorization header for
 * the expected access key (it does not verify the signature) and keeps objects in memory.
 */
export interface FakeS3 {
  endpoint: string;
  accessKeyId: string;
  secretAccessKey: string;
  objects: Map<string, { body: Buffer; contentType: string }>;
  requests: { method: string; path: string }[];
  close(): Promise<void>;
}

const xmlError = (code: string, message: string) =>
  `<?xml version="1.0" encoding="UTF-8"?><Error><Code>${code}</Code><Message>${message}</Message></Error>`;

export async function startFakeS3(options: { buckets: string[]; port?: number }): Promise<FakeS3> {
  const accessKeyId = 'FAKES3ACCESSKEY';
  const secretAccessKey = 'fake-s3-secret-for-tests-only';
  const buckets = new Set(options.buckets);
  const objects = new Map<string, { body: Buffer; contentType: string }>();
  const requests: { method: string; path: string }[] = [];

  const server = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      const url = new URL(req.url ?? '/', 'http://fake-s3');
      const [, bucket = '', ...rest] = url.pathname.split('/');
      const key = rest.map(decodeURIComponent).join('/');
      requests.push({ method: req.method ?? '', path: url.pathname });
      const send = (status: number, body = '', headers: Record<string, string> = {}) => {
        res.writeHead(status, { 'content-type': 'application/xml', ...headers });
        res.end(body);
      };
      const auth = req.headers.authorization ?? '';
      if (!auth.startsWith(`AWS4-HMAC-SHA256 Credential=${accessKeyId}/`)) {
        return send(403, xmlError('InvalidAccessKeyId', 'The access key is not known here'));
      }
      if (!buckets.has(bucket)) return send(404, xmlError('NoSuchBucket', 'No such bucket'));
      const id = `${bucket}/${key}`;
      switch (req.method) {
        case 'PUT': {
          const body = Buffer.concat(chunks);
          objects.set(id, { body, contentType: req.headers['content-type'] ?? 'application/octet-stream' });
          return send(200, '', { etag: `"${body.length.toString(16)}"` });
        }
        case 'GET':
        case 'HEAD': {
          const o = objects.get(id);
          if (!o)
            return send(404, req.method === 'HEAD' ? '' : xmlError('NoSuchKey', 'The specified key does not exist.'));
          res.writeHead(200, { 'content-type': o.contentType, 'content-length': String(o.body.length) });
          return res.end(req.method === 'HEAD' ? undefined : o.body);
        }
        case 'DELETE':
          objects.delete(id);
          return send(204);
        default:
          return send(405, xmlError('MethodNotAllowed', 'Not supported by the fake'));
      }
    });
  });
  await new Promise<void>((resolve) => server.listen(options.port ?? 0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  return {
    endpoint: `http://127.0.0.1:${port}`,
    accessKeyId,
    secretAccessKey,
    objects,
    requests,
    close: () => new Promise((resolve) => server.close(() => resolve())),
  };
}
