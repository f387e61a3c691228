/** `--time-zone` as the interval-data commands read it: default UTC, refused (a usage error) when this system does not know it. */
import { isKnownTimeZone } from '@trivar/core';
import { UsageError } from '../exitCodes.js';

export function timeZoneOption(given: string | undefined): string {
  const zone = given ?? 'UTC';
  if (!isKnownTimeZone(zone)) throw new UsageError(`--time-zone: "${zone}" is not a time zone this system knows (expected an IANA name such as Europe/Lisbon or America/Chicago)`);
  return zone;
}
