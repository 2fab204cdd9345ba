import { ApiError } from './http';

/**
 * A multipart upload that reports upload progress (fetch cannot), with the same
 * contract as http(): resolves with the JSON body or throws ApiError; no redirects, no toasts.
 */
export function upload<T>(url: string, form: FormData, onProgress?: (fraction: number) => void): Promise<T> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', url);
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable && onProgress) onProgress(e.loaded / e.total);
    };
    xhr.onerror = () => reject(new ApiError(0, 'network', 'The upload did not reach the server.'));
    xhr.onload = () => {
      let body: { error?: { code?: string; message?: string; details?: ApiError['details'] } } | null = null;
      try {
        body = xhr.responseText ? JSON.parse(xhr.responseText) : null;
      } catch {
        body = null;
      }
      if (xhr.status >= 200 && xhr.status < 300) return resolve(body as T);
      const e = body?.error ?? {};
      reject(
        new ApiError(xhr.status, e.code ?? 'http_error', e.message ?? `Upload failed (${xhr.status}).`, e.details),
      );
    };
    xhr.send(form);
  });
}
