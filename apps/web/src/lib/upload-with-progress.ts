import { ApiError } from './api-client';

function parseJson(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    // A proxy error page is HTML; the status still tells what happened.
    return null;
  }
}

/**
 * Multipart POST over XMLHttpRequest, because fetch reports no upload progress and large files need a real bar.
 * `fields` go before the file so the server knows them when the file arrives. Errors come back as ApiError,
 * like every other request.
 */
export function uploadWithProgress<T>(
  url: string,
  file: File,
  options: { fields?: Record<string, string>; onProgress?: ((fraction: number) => void) | undefined } = {},
): Promise<T> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', url);
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.withCredentials = true;
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable) options.onProgress?.(event.loaded / event.total);
    };
    xhr.onerror = () => reject(new ApiError(0, 'network_error', 'The server could not be reached. Check your connection and try again.'));
    xhr.onload = () => {
      const body = parseJson(xhr.responseText);
      if (xhr.status >= 200 && xhr.status < 300) return resolve(body as T);
      const error = (body as { error?: { code?: string; message?: string; details?: unknown } } | null)?.error;
      reject(
        new ApiError(
          xhr.status,
          error?.code ?? `http_${xhr.status}`,
          error?.message ?? (xhr.status === 413 ? 'The file is larger than this shop allows.' : `The server answered ${xhr.status}.`),
          error?.details,
        ),
      );
    };
    const form = new FormData();
    for (const [name, value] of Object.entries(options.fields ?? {})) form.append(name, value);
    form.append('file', file);
    xhr.send(form);
  });
}
