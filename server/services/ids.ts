const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** True for a UUID in canonical text form (anything else can name no row). */
export const isUuid = (value: string): boolean => UUID.test(value);
