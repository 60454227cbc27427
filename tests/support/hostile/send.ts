import { randomBytes } from 'node:crypto';
import http from 'node:http';
import { deflateSync } from 'node:zlib';
import type { AuthVariant, BodyKind, Edit, FileVariant, HostileCase } from './cases';
import { REMOVE, setAt } from './schema-slots';
import { RawJson } from './values';

// Turns a route's valid request plus a hostile case into bytes on the wire, and sends them to
// a real listening server.

export type Credentials = { token: string; accessCookie: string };

export type BaseRequest = {
  method: string;
  /** OpenAPI path, e.g. /api/labs/{labId}/batches. */
  path: string;
  params: Record<string, string>;
  bodyKind: BodyKind;
  body?: unknown;
  auth: 'bearer' | 'none';
  credentials: Credentials;
  photo?: Buffer;
};

export type Answer = { status: number; contentType: string; text: string; json: unknown };

type Built = {
  params: Record<string, { value: string; encoded: boolean }>;
  body: unknown;
  raw?: { contentType: string | null; text: string | Buffer; encoding?: string };
  auth: AuthVariant;
  file: FileVariant | 'photo';
};

function applyEdit(built: Built, edit: Edit): void {
  switch (edit.at) {
    case 'body':
      built.body = setAt(built.body, edit.path, edit.value);
      break;
    case 'body-root':
      built.body = edit.value;
      break;
    case 'raw-body':
      built.raw = { contentType: edit.contentType, text: edit.text, encoding: edit.encoding };
      break;
    case 'param':
      built.params[edit.name] = { value: edit.value, encoded: edit.encoded ?? false };
      break;
    case 'auth':
      built.auth = edit.variant;
      break;
    case 'file':
      built.file = edit.variant;
  }
}

/** JSON text in which RawJson values appear as their own tokens (1e999 and the like). */
export function toJsonText(value: unknown): string {
  const raws: string[] = [];
  const text = JSON.stringify(value, (_key, v: unknown) => {
    if (v instanceof RawJson) {
      raws.push(v.text);
      return `@@raw${raws.length - 1}@@`;
    }
    return v;
  });
  return raws.reduce((t, raw, i) => t.replace(`"@@raw${i}@@"`, raw), text ?? '');
}

function forgedToken(token: string): string {
  const [, payload] = token.split('.');
  const header = Buffer.from(JSON.stringify({ alg: 'none', typ: 'JWT' })).toString('base64url');
  return `${header}.${payload}.`;
}

function authHeaders(variant: AuthVariant, c: Credentials): Record<string, string> {
  switch (variant) {
    case 'bearer':
      return { Authorization: `Bearer ${c.token}` };
    case 'none':
      return {};
    case 'garbage':
      return { Authorization: `Bearer ${randomBytes(24).toString('base64url')}` };
    case 'basic':
      return { Authorization: 'Basic cXVlbmNoOmJvb2s=' };
    case 'forged':
      return { Authorization: `Bearer ${forgedToken(c.token)}` };
    case 'cookie-without-csrf':
      return { Cookie: c.accessCookie };
    case 'cookie-wrong-csrf':
      return { Cookie: c.accessCookie, 'X-CSRF-Token': randomBytes(32).toString('base64url') };
  }
}

function crc32(data: Buffer): number {
  let crc = ~0;
  for (const byte of data) {
    crc ^= byte;
    for (let k = 0; k < 8; k++) crc = (crc >>> 1) ^ (0xedb88320 & -(crc & 1));
  }
  return ~crc >>> 0;
}

function pngChunk(type: string, data: Buffer): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([length, body, crc]);
}

/** A small PNG whose header claims 100,000 × 100,000 pixels: a decompression bomb's shape. */
function pixelBomb(): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(100_000, 0);
  ihdr.writeUInt32BE(100_000, 4);
  ihdr.set([8, 0, 0, 0, 0], 8);
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    pngChunk('IHDR', ihdr),
    pngChunk('IDAT', deflateSync(Buffer.alloc(1000))),
    pngChunk('IEND', Buffer.alloc(0)),
  ]);
}

const GIF = Buffer.from('R0lGODlhAQABAIAAAAAAAP///yH5BAEAAAAALAAAAAABAAEAAAIBRAA7', 'base64');
const SVG = Buffer.from(
  '<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><script>alert(1)</script></svg>',
);

type FilePart = { field: string; name: string; type: string; data: Buffer };

function fileParts(variant: FileVariant | 'photo', photo: Buffer): FilePart[] {
  const part = (data: Buffer, type = 'image/jpeg', field = 'photo'): FilePart[] => [
    { field, name: 'specimen.jpg', type, data },
  ];
  switch (variant) {
    case 'photo':
      return part(photo);
    case 'missing':
      return [];
    case 'empty':
      return part(Buffer.alloc(0));
    case 'text':
      return part(Buffer.from('not a photo at all'));
    case 'random-bytes':
      return part(randomBytes(256));
    case 'truncated-jpeg':
      return part(photo.subarray(0, Math.floor(photo.length / 2)));
    case 'svg':
      return part(SVG, 'image/svg+xml');
    case 'gif':
      return part(GIF, 'image/gif');
    case 'pixel-bomb':
      return part(pixelBomb(), 'image/png');
    case 'wrong-field':
      return part(photo, 'image/jpeg', 'file');
    case 'two-files':
      return [...part(photo), ...part(photo)];
    case 'too-big':
      return part(Buffer.concat([photo, Buffer.alloc(15 * 1024 * 1024)]));
  }
}

function fieldText(value: unknown): string {
  if (typeof value === 'string') return value;
  if (value instanceof RawJson) return value.text;
  return typeof value === 'object' ? JSON.stringify(value) : String(value);
}

/**
 * A field name as a well-formed multipart/form-data header: quotes and line breaks
 * percent-encoded (as browsers do), a backslash as a quoted-pair (RFC 7578 names are quoted
 * strings). Unescaped, either would end or bend the name, and the server would see another,
 * valid request than the one the case describes.
 */
const formName = (name: string) =>
  name.replace(/\\/g, '\\\\').replace(/"/g, '%22').replace(/\r/g, '%0D').replace(/\n/g, '%0A');

function multipart(fields: unknown, files: FilePart[]): { type: string; data: Buffer } {
  const boundary = `----hostile${randomBytes(8).toString('hex')}`;
  const chunks: Buffer[] = [];
  const head = (extra: string) => Buffer.from(`--${boundary}\r\n${extra}\r\n\r\n`);
  const entries =
    fields && typeof fields === 'object' && !Array.isArray(fields)
      ? Object.entries(fields)
      : [['body', fields] as const];
  for (const [name, value] of entries) {
    // A list is the field repeated; an empty list still sends the field once, empty.
    const values = Array.isArray(value) ? (value.length ? value : ['']) : [value];
    for (const v of values) {
      chunks.push(
        head(`Content-Disposition: form-data; name="${formName(name)}"`),
        Buffer.from(fieldText(v)),
        Buffer.from('\r\n'),
      );
    }
  }
  for (const f of files) {
    chunks.push(
      head(
        `Content-Disposition: form-data; name="${f.field}"; filename="${f.name}"\r\nContent-Type: ${f.type}`,
      ),
      f.data,
      Buffer.from('\r\n'),
    );
  }
  chunks.push(Buffer.from(`--${boundary}--\r\n`));
  return { type: `multipart/form-data; boundary=${boundary}`, data: Buffer.concat(chunks) };
}

const bytesOf = (text: string | Buffer) => (typeof text === 'string' ? Buffer.from(text) : text);

const agent = new http.Agent({ keepAlive: true, maxSockets: 4 });

/** Sends the base request with the case's changes applied (noise first, then breaking). */
export function sendCase(baseUrl: string, base: BaseRequest, c: HostileCase): Promise<Answer> {
  const built: Built = {
    params: Object.fromEntries(
      Object.entries(base.params).map(([k, v]) => [k, { value: v, encoded: false }]),
    ),
    body: base.body,
    auth: base.auth,
    file: 'photo',
  };
  for (const change of [...c.noise, ...c.breaking]) applyEdit(built, change.edit);
  const path = base.path.replace(/\{(\w+)\}/g, (_m, name: string) => {
    const p = built.params[name]!;
    return p.encoded ? p.value : encodeURIComponent(p.value);
  });
  let payload: { type: string | null; data: Buffer } | undefined;
  if (built.raw) payload = { type: built.raw.contentType, data: bytesOf(built.raw.text) };
  else if (base.bodyKind === 'csv' && typeof built.body === 'string')
    payload = { type: 'text/csv', data: Buffer.from(built.body) };
  else if (base.bodyKind === 'multipart')
    payload = multipart(built.body, fileParts(built.file, base.photo!));
  else if (base.bodyKind === 'json' && built.body !== REMOVE) {
    payload = { type: 'application/json', data: Buffer.from(toJsonText(built.body)) };
  }
  const headers: Record<string, string> = {
    Accept: 'application/json',
    ...authHeaders(built.auth, base.credentials),
    ...(payload?.type ? { 'Content-Type': payload.type } : {}),
    ...(payload ? { 'Content-Length': String(payload.data.length) } : {}),
    ...(built.raw?.encoding ? { 'Content-Encoding': built.raw.encoding } : {}),
  };
  return new Promise((resolve, reject) => {
    const req = http.request(
      `${baseUrl}${path}`,
      { method: base.method, agent, headers },
      (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (chunk: Buffer) => chunks.push(chunk));
        res.on('end', () => {
          const text = Buffer.concat(chunks).toString('utf8');
          let json: unknown;
          try {
            json = JSON.parse(text);
          } catch {
            json = undefined;
          }
          resolve({
            status: res.statusCode ?? 0,
            contentType: String(res.headers['content-type'] ?? ''),
            text,
            json,
          });
        });
      },
    );
    // The server may answer (413) and close before the whole upload is written: wait for that
    // answer rather than fail on the broken pipe.
    req.on('error', (err: NodeJS.ErrnoException) => {
      const cutShort = err.code === 'EPIPE' || err.code === 'ECONNRESET';
      setTimeout(() => reject(err), cutShort ? 2000 : 0);
    });
    if (payload) req.write(payload.data);
    req.end();
  });
}
