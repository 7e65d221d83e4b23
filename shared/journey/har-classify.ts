import type { HarEntry } from './har-schema';

/**
 * Which recorded requests belong in a journey: the pages (document) and the calls a page makes
 * to its service (api). Static assets, CORS preflights and anything that is not plain HTTP(S)
 * (data:, blob:, websockets, extension URLs) are left out.
 */
export type HarEntryKind = 'document' | 'api' | 'static' | 'preflight' | 'other';

export const KEPT_KINDS: ReadonlySet<HarEntryKind> = new Set(['document', 'api']);

const STATIC_RESOURCE_TYPES = new Set(['stylesheet', 'script', 'image', 'font', 'media', 'manifest', 'texttrack']);
const OTHER_RESOURCE_TYPES = new Set(['websocket', 'ping', 'eventsource', 'signedexchange', 'cspviolationreport']);

const STATIC_EXTENSIONS = new Set([
  'css', 'js', 'mjs', 'map', 'png', 'jpg', 'jpeg', 'gif', 'svg', 'webp', 'avif', 'ico', 'bmp',
  'woff', 'woff2', 'ttf', 'otf', 'eot', 'mp4', 'webm', 'mp3', 'ogg', 'wav', 'wasm',
]);

function isStaticMime(mime: string): boolean {
  return (
    /^(image|font|audio|video)\//.test(mime) ||
    /^(text|application)\/(x-)?(javascript|ecmascript)$/.test(mime) ||
    mime === 'text/css' ||
    mime === 'application/wasm' ||
    /^application\/(x-)?font-/.test(mime)
  );
}

function isApiMime(mime: string): boolean {
  return /json|xml|graphql|^text\/plain$|^application\/x-www-form-urlencoded$|^multipart\//.test(mime);
}

export function classifyHarEntry(entry: HarEntry): { kind: HarEntryKind; reason: string } {
  const url = new URL(entry.request.url);
  if (url.protocol !== 'http:' && url.protocol !== 'https:') return { kind: 'other', reason: `${url.protocol} URL` };
  const method = entry.request.method.toUpperCase();
  if (method === 'OPTIONS' || entry._resourceType === 'preflight') return { kind: 'preflight', reason: 'CORS preflight' };

  const type = entry._resourceType?.toLowerCase();
  if (type === 'document') return { kind: 'document', reason: 'page load' };
  if (type === 'xhr' || type === 'fetch') return { kind: 'api', reason: `${type} call` };
  if (type && STATIC_RESOURCE_TYPES.has(type)) return { kind: 'static', reason: `${type}` };
  if (type && OTHER_RESOURCE_TYPES.has(type)) return { kind: 'other', reason: `${type}` };

  const mime = entry.response.content.mimeType.split(';')[0].trim().toLowerCase();
  if (mime === 'text/html' || mime === 'application/xhtml+xml') return { kind: 'document', reason: mime };
  if (isStaticMime(mime)) return { kind: 'static', reason: mime };
  if (isApiMime(mime)) return { kind: 'api', reason: mime };
  const extension = url.pathname.match(/\.([a-z0-9]+)$/i)?.[1].toLowerCase();
  if (extension && STATIC_EXTENSIONS.has(extension)) return { kind: 'static', reason: `.${extension} file` };
  return { kind: 'api', reason: method === 'GET' ? 'request without a static type' : `${method} request` };
}
