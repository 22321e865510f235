import { planBundle, buildBundle, sha256Hex } from '$lib/formats/bundle';
import { so2BundleInput } from '$lib/formats/bundle/so2.testdata';
const p = await planBundle(so2BundleInput());
for (const f of p.files) console.log(f.sha256, f.path);
console.log('zip', await sha256Hex(await buildBundle(so2BundleInput())));
console.log('zip2', await sha256Hex(await buildBundle(so2BundleInput({ tuning: { gammasBohrInv: [0.3], layout: 'combined' } }))));
