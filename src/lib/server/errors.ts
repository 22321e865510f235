/** Domain errors raised by services; routes turn them into form failures or JSON error bodies. */
export class ValidationError extends Error {
	constructor(
		message: string,
		readonly field?: string,
		readonly line?: number
	) {
		super(message);
		this.name = 'ValidationError';
	}
}

/** The record changed since the caller read it (optimistic concurrency). */
export class StaleVersionError extends Error {
	constructor(readonly entity: string) {
		super(`This ${entity} was changed by someone else since you opened it. Nothing was overwritten: reload to see their change, then apply yours again.`);
		this.name = 'StaleVersionError';
	}
}

export class NotFoundError extends Error {
	constructor(readonly entity: string) {
		super(`${entity} not found`);
		this.name = 'NotFoundError';
	}
}

/** A record that blocks a delete, with the page where the user can deal with it. */
export interface DependentLink {
	label: string;
	href: string;
}

/** Refused because other records depend on this one. */
export class DependentsError extends Error {
	constructor(
		message: string,
		readonly dependents: string[],
		readonly links: DependentLink[] = []
	) {
		super(message);
		this.name = 'DependentsError';
	}
}

/** A pending upload that can no longer be confirmed: already confirmed or discarded (409), or expired (410). */
export class UploadStateError extends Error {
	constructor(
		message: string,
		readonly status: 409 | 410
	) {
		super(message);
		this.name = 'UploadStateError';
	}
}
