/** One part of a multipart/form-data body (RFC 7578): a text field, or a file when `filename` is set. */
export interface FormPart {
  name: string;
  value: Buffer | string;
  filename?: string;
  contentType?: string;
}

/** How to damage the framing of a multipart body (RFC 2046 §5.1.1 boundaries). */
export type MultipartDamage = 'none' | 'no-closing-boundary' | 'truncated' | 'wrong-boundary' | 'no-boundary-parameter' | 'header-without-blank-line';

const CRLF = '\r\n';

/**
 * Writes the body bytes and the Content-Type header. Names and file names go out as given
 * (quotes, CR/LF and traversal included) because the fuzz suite wants the server to see them.
 */
export function multipartRequest(parts: readonly FormPart[], damage: MultipartDamage = 'none', boundary = 'tidemarkFuzzBoundary7MA4YWxk'): { contentType: string; body: Buffer } {
  const chunks: Buffer[] = [];
  for (const part of parts) {
    const disposition = `Content-Disposition: form-data; name="${part.name}"${part.filename === undefined ? '' : `; filename="${part.filename}"`}`;
    const type = part.contentType === undefined ? '' : `${CRLF}Content-Type: ${part.contentType}`;
    const separator = damage === 'header-without-blank-line' ? CRLF : CRLF + CRLF;
    chunks.push(Buffer.from(`--${boundary}${CRLF}${disposition}${type}${separator}`, 'utf8'), Buffer.isBuffer(part.value) ? part.value : Buffer.from(part.value, 'utf8'), Buffer.from(CRLF));
  }
  if (damage !== 'no-closing-boundary' && damage !== 'truncated') chunks.push(Buffer.from(`--${boundary}--${CRLF}`));
  let body = Buffer.concat(chunks);
  if (damage === 'truncated') body = body.subarray(0, Math.max(1, Math.floor(body.length / 2)));
  const declared = damage === 'wrong-boundary' ? `${boundary}X` : boundary;
  const contentType = damage === 'no-boundary-parameter' ? 'multipart/form-data' : `multipart/form-data; boundary=${declared}`;
  return { contentType, body };
}
