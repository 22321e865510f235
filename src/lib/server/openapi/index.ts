// Every feature's API operations, registered once; add a file per feature and import it here.
import pkg from '../../../../package.json' with { type: 'json' };
import './core';
import './dielectric';
import './tuning';
import './levels';
import './trash';
import { allOperations, buildDocument } from './registry';

let cached: ReturnType<typeof buildDocument> | undefined;

export function openapiDocument() {
	cached ??= buildDocument(pkg.version);
	return cached;
}

export { allOperations };
