/** A multipart/form-data body built by hand (route tests pass raw bytes). */
export function multipartBody(fields: Record<string, string | { name: string; type: string; text: string }>): { contentType: string; data: Uint8Array } {
  const boundary = `----edgefield${Math.random().toString(16).slice(2)}`;
  let out = '';
  for (const [k, v] of Object.entries(fields)) {
    out += `--${boundary}\r\n`;
    if (typeof v === 'string') out += `Content-Disposition: form-data; name="${k}"\r\n\r\n${v}\r\n`;
    else out += `Content-Disposition: form-data; name="${k}"; filename="${v.name}"\r\nContent-Type: ${v.type}\r\n\r\n${v.text}\r\n`;
  }
  out += `--${boundary}--\r\n`;
  return { contentType: `multipart/form-data; boundary=${boundary}`, data: new TextEncoder().encode(out) };
}
