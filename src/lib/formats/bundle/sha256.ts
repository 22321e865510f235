/**
 * SHA-256 of bytes or text as 64 lower-case hex digits, through WebCrypto (`crypto.subtle.digest`),
 * which browsers and Node 20 both provide as a global. Algorithm: FIPS 180-4.
 */

/** Lower-case hex SHA-256 of the bytes (text is hashed as its UTF-8 encoding). */
export async function sha256Hex(data: Uint8Array | string): Promise<string> {
	const bytes = typeof data === 'string' ? new TextEncoder().encode(data) : data;
	const subtle = globalThis.crypto?.subtle;
	if (!subtle) throw new Error('SHA-256 needs WebCrypto (crypto.subtle), which this runtime does not provide');
	const digest = new Uint8Array(await subtle.digest('SHA-256', bytes as BufferSource));
	let hex = '';
	for (const b of digest) hex += b.toString(16).padStart(2, '0');
	return hex;
}

/** A SHA-256 written as 64 lower-case hex digits. */
export const SHA256_HEX = /^[0-9a-f]{64}$/;
