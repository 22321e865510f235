import { ValidationError } from './errors';

/**
 * Form fields as strings, plus an uploaded text file read into `target` (the file wins over pasted text).
 * Used by the CIF import and tensor upload forms.
 */
export async function readFormWithFile(request: Request, fileField: string, target: string, maxBytes: number): Promise<Record<string, string>> {
	const form = await request.formData();
	const values: Record<string, string> = {};
	for (const [k, v] of form) if (typeof v === 'string') values[k] = v;
	const file = form.get(fileField);
	if (file instanceof File && file.size > 0) {
		if (file.size > maxBytes) throw new ValidationError(`the file ${file.name} is ${(file.size / 1e6).toFixed(2)} MB, over the limit of ${maxBytes / 1e6} MB`, target);
		values[target] = await file.text();
		values.fileName = values.fileName || file.name;
	}
	return values;
}
