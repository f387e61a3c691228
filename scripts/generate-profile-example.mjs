#!/usr/bin/env node
// Writes a year of invented 1-minute interval data for examples/quay-street-flats.yaml.
// Deterministic: the same seed gives the same file, byte for byte. Times are local wall-clock
// times in Europe/Dublin without an offset, so the file has the spring-forward hour missing and
// the autumn hour written twice, like a logger on local time. A few logger outages (gaps) and
// repeated rows are put in on purpose, so the report has something to say about them.
//
//   node scripts/generate-profile-example.mjs <out.csv> [--days N] [--seed S]
import { createWriteStream } from 'node:fs';

const args = process.argv.slice(2);
const out = args.find((a) => !a.startsWith('--'));
if (!out) {
  console.error('usage: node scripts/generate-profile-example.mjs <out.csv> [--days N] [--seed S]');
  process.exit(2);
}
const option = (name, fallback) => {
  const i = args.indexOf(name);
  return i >= 0 ? Number(args[i + 1]) : fallback;
};
const days = option('--days', 365);
const seed = option('--seed', 20250101);
const ZONE = 'Europe/Dublin';

// mulberry32: small, fast, good enough for invented data.
let state = seed >>> 0;
const random = () => {
  state = (state + 0x6d2b79f5) >>> 0;
  let t = state;
  t = Math.imul(t ^ (t >>> 15), t | 1);
  t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
  return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
};
const gauss = () => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());

// Local offset per UTC hour, from the platform's zone data.
const format = new Intl.DateTimeFormat('en-GB', { timeZone: ZONE, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit' });
const offsetCache = new Map();
const offsetAt = (utc) => {
  const hour = Math.floor(utc / 3_600_000);
  let o = offsetCache.get(hour);
  if (o === undefined) {
    const p = Object.fromEntries(format.formatToParts(hour * 3_600_000).map((x) => [x.type, x.value]));
    o = Date.UTC(+p.year, +p.month - 1, +p.day, +p.hour, +p.minute) - hour * 3_600_000;
    offsetCache.set(hour, o);
  }
  return o;
};
const pad = (x) => (x < 10 ? `0${x}` : `${x}`);

const start = Date.UTC(2025, 0, 1, 0, 0); // local midnight in winter (offset 0)
const minutes = days * 1440;
// Logger outages: [start minute, length] and rows written twice.
const outages = [
  [Math.floor(minutes * 0.21), 47],
  [Math.floor(minutes * 0.58), 180],
  [Math.floor(minutes * 0.83), 12],
];
const repeats = new Set([Math.floor(minutes * 0.4), Math.floor(minutes * 0.4) + 1]);
const inOutage = (m) => outages.some(([s, n]) => m >= s && m < s + n);

const file = createWriteStream(out);
file.write('time,flats A [kW],flats B [kW],flats C [kW],chargers [x],heat pumps [x],Roof PV [x]\n');
let flatNoise = [0, 0, 0];
let cloud = 0.7;
const chargerLeft = [0, 0, 0];
let heatPumpOn = 0;
let heatPumpHold = 0;
let buffer = '';
for (let m = 0; m < minutes; m++) {
  const utc = start + m * 60_000;
  const local = utc + offsetAt(utc);
  const d = new Date(local);
  const hour = d.getUTCHours() + d.getUTCMinutes() / 60;
  const dayOfYear = Math.floor((utc - start) / 86_400_000);
  const winter = 0.5 + 0.5 * Math.cos((2 * Math.PI * (dayOfYear - 15)) / 365); // 1 in mid-January, 0 in July
  const weekend = d.getUTCDay() === 0 || d.getUTCDay() === 6;
  // Flats: a base, a morning and an evening bump, more in winter; slow random drift per phase.
  const morning = Math.exp(-(((hour - (weekend ? 9 : 7.5)) / 1.2) ** 2));
  const evening = Math.exp(-(((hour - 19) / 2.2) ** 2));
  const shape = 0.35 + 1.1 * morning + 2.2 * evening + 1.4 * winter * (0.6 + evening);
  const flats = [1, 0.85, 1.18].map((share, k) => {
    flatNoise[k] = 0.995 * flatNoise[k] + 0.06 * gauss();
    return Math.max(0.2, 8 * 0.55 * share * shape * (1 + 0.25 * flatNoise[k]));
  });
  // Chargers: sessions start mostly in the evening and run 2–5 hours.
  for (let k = 0; k < 3; k++) {
    if (chargerLeft[k] > 0) chargerLeft[k]--;
    else if (random() < (hour > 17 && hour < 23 ? 0.004 : 0.0004)) chargerLeft[k] = Math.floor(120 + 180 * random());
  }
  const chargers = chargerLeft.filter((x) => x > 0).length / 3;
  // Heat pumps: cycle with the cold, at least 10 minutes per state.
  if (heatPumpHold > 0) heatPumpHold--;
  else {
    const want = random() < 0.15 + 0.75 * winter * (hour < 7 || hour > 16 ? 1 : 0.6) ? (random() < 0.5 + 0.5 * winter ? 1 : 0.5) : 0;
    if (want !== heatPumpOn) {
      heatPumpOn = want;
      heatPumpHold = 10 + Math.floor(20 * random());
    }
  }
  // PV: daylight bell, longer and higher in summer, clouds drifting.
  const noon = 13.2;
  const halfDay = 4 + 4 * (1 - winter);
  cloud = Math.min(1, Math.max(0.15, cloud + 0.02 * gauss()));
  const sun = Math.max(0, Math.cos(((hour - noon) / halfDay) * (Math.PI / 2)));
  const pv = Math.abs(hour - noon) < halfDay ? sun * (0.45 + 0.5 * (1 - winter)) * cloud : 0;
  if (inOutage(m)) continue;
  const stamp = `${d.getUTCFullYear()}-${pad(d.getUTCMonth() + 1)}-${pad(d.getUTCDate())} ${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())}`;
  const row = `${stamp},${flats[0].toFixed(3)},${flats[1].toFixed(3)},${flats[2].toFixed(3)},${chargers.toFixed(3)},${heatPumpOn},${pv.toFixed(3)}\n`;
  buffer += repeats.has(m) ? row + row : row;
  if (buffer.length > 1 << 20) {
    if (!file.write(buffer)) await new Promise((r) => file.once('drain', r));
    buffer = '';
  }
}
file.end(buffer);
await new Promise((r) => file.on('finish', r));
