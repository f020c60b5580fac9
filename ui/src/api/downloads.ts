import { useMutation } from '@tanstack/react-query';
import { saveBlob } from '../lib/download.js';
import { apiDownload } from './client.js';
import type { MutationHandlers } from './mutations.js';

export interface DownloadedFile {
  fileName: string;
  bytes: number;
  /** SHA-256 of the bytes received, computed in the browser (null where Web Crypto is unavailable). */
  sha256: string | null;
}

async function sha256Hex(blob: Blob): Promise<string | null> {
  if (!globalThis.crypto?.subtle) return null;
  const digest = await crypto.subtle.digest('SHA-256', await blob.arrayBuffer());
  return Array.from(new Uint8Array(digest), (b) => b.toString(16).padStart(2, '0')).join('');
}

/**
 * Fetches a zip with the session's Bearer token (a plain link could not carry it), then hands it to
 * the browser as a download through an object URL.
 */
export async function downloadZip(path: string, fallbackName: string): Promise<DownloadedFile> {
  const { blob, filename } = await apiDownload(path);
  const fileName = filename ?? fallbackName;
  saveBlob(blob, fileName);
  return { fileName, bytes: blob.size, sha256: await sha256Hex(blob) };
}

/** A zip download as a mutation: pending while the bytes arrive, the received file's digest on success. */
export function useDownloadZip(path: string, fallbackName: string, handlers?: MutationHandlers<DownloadedFile, void>) {
  return useMutation({ mutationFn: () => downloadZip(path, fallbackName), ...handlers });
}
