/** Multipart upload with byte progress (fetch cannot report upload progress; XHR can). */
export type UploadResult = { status: number; body: any };

export function uploadWithProgress(url: string, form: FormData, onProgress: (sent: number, total: number) => void): Promise<UploadResult> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', url);
    xhr.responseType = 'json';
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(e.loaded, e.total);
    xhr.onload = () => resolve({ status: xhr.status, body: xhr.response });
    xhr.onerror = () => reject(new Error('The upload was interrupted. Check your connection and try again.'));
    xhr.send(form);
  });
}

export function newImportId(): string {
  const bytes = crypto.getRandomValues(new Uint8Array(12));
  return `imp_${btoa(String.fromCharCode(...bytes)).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '')}`;
}
