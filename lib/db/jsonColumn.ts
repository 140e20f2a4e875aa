/**
 * A JSON column's value as an object. MariaDB stores JSON as LONGTEXT, so the driver may hand
 * back the text instead of the parsed value; every reader of a JSON column goes through here.
 */
export function jsonColumn<T>(value: unknown): T {
  return (typeof value === 'string' ? JSON.parse(value) : value) as T;
}
