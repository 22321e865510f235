import { MAX_GEOMETRY_BYTES } from '$lib/schemas/molecule';
import { ValidationError } from './errors';

/** Form fields as strings, plus an uploaded XYZ file read as text (it wins over the pasted text). */
export async function readMoleculeForm(request: Request): Promise<Record<string, string>> {
	const form = await request.formData();
	const values: Record<string, string> = {};
	for (const [k, v] of form) if (typeof v === 'string') values[k] = v;
	const file = form.get('xyzFile');
	if (file instanceof File && file.size > 0) {
		if (file.size > MAX_GEOMETRY_BYTES)
			throw new ValidationError(`the file ${file.name} is ${(file.size / 1e6).toFixed(1)} MB, over the limit of ${MAX_GEOMETRY_BYTES / 1e6} MB`, 'geometryXyz');
		values.geometryXyz = await file.text();
	}
	return values;
}
