// One ride file, one request: XMLHttpRequest rather than fetch because only
// its upload events report how many bytes have left the browser.
import type { UploadFileResult } from './types';

export interface RideFileRequest {
  clientId: string;
  importProfileId: string | null;
  file: File;
}

export type SendResult = { ok: true; result: UploadFileResult } | { ok: false; message: string };

const UNREACHABLE = 'Kinloop could not be reached, so the file was not saved. Check your connection and try again.';

export function sendRideFile(request: RideFileRequest, onProgress: (loaded: number, total: number) => void): Promise<SendResult> {
  const form = new FormData();
  // The server checks the client before it stores any file, so clientId goes first.
  form.append('clientId', request.clientId);
  if (request.importProfileId) form.append('importProfileId', request.importProfileId);
  // Files without a start time of their own are dated by when the cycle wrote them.
  if (request.file.lastModified) form.append('fallbackStartedAt', new Date(request.file.lastModified).toISOString());
  form.append('files', request.file, request.file.name);

  return new Promise((resolve) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', '/api/uploads');
    xhr.withCredentials = true;
    xhr.upload.onprogress = (e) => onProgress(e.loaded, e.lengthComputable ? e.total : request.file.size);
    xhr.onerror = () => resolve({ ok: false, message: UNREACHABLE });
    xhr.onabort = () => resolve({ ok: false, message: UNREACHABLE });
    xhr.onload = () => {
      let body: { files?: UploadFileResult[]; error?: { message?: string } } | null = null;
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        body = null;
      }
      if (xhr.status === 401) {
        window.location.assign(`/sign-in?next=${encodeURIComponent(window.location.pathname + window.location.search)}`);
      }
      const result = body?.files?.[0];
      if ((xhr.status === 200 || xhr.status === 202) && result) {
        resolve({ ok: true, result });
        return;
      }
      resolve({ ok: false, message: body?.error?.message ?? `The server answered ${xhr.status}, so the file was not saved. Try again in a moment.` });
    };
    xhr.send(form);
  });
}
