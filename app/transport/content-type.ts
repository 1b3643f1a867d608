/**
 * The media type a screen file is served with, by its extension: one table for the preview's HTTP
 * server and the desktop shell's file protocol (unknown extensions as application/octet-stream).
 */
import { extname } from 'node:path';

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.json': 'application/json',
  '.ico': 'image/x-icon',
  '.woff2': 'font/woff2',
};

export function contentTypeOf(file: string): string {
  return TYPES[extname(file)] ?? 'application/octet-stream';
}
