import { describe, expect, it } from 'vitest';
import { SHA256_HEX, sha256Hex } from './sha256';

// Reference digests: FIPS 180-2, Appendix B (B.1 "abc", B.2 the 448-bit message), and the
// well-known digest of the empty message (NIST example values for SHA-256).
describe('sha256Hex (FIPS 180-2 appendix B test vectors)', () => {
	it('"abc"', async () =>
		expect(await sha256Hex('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad'));
	it('the two-block message', async () =>
		expect(await sha256Hex('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq')).toBe(
			'248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1'
		));
	it('the empty message', async () =>
		expect(await sha256Hex(new Uint8Array())).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855'));
	it('hashes text as UTF-8', async () =>
		expect(await sha256Hex('Å')).toBe(await sha256Hex(new Uint8Array([0xc3, 0x85]))));
	it('format', async () => expect(SHA256_HEX.test(await sha256Hex('x'))).toBe(true));
});
