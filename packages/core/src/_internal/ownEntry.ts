/**
 * A named entry of a plain record (a file's `profile.groups`, a scenario's `loads`), read as the file
 * wrote it: only the record's own keys count. `record[name]` would also find what every object
 * inherits — `toString`, `constructor`, `__proto__` — and a load or group called that would read a
 * function, or a name the file never gave would read as one.
 */
export function ownEntry<T>(record: Readonly<Record<string, T>>, name: string): T | undefined {
  return Object.hasOwn(record, name) ? record[name] : undefined;
}
