import { chromium } from 'playwright-core';
const b = await chromium.launch({ executablePath: '/usr/bin/chromium' });
const p = await b.newPage({ viewport: { width: 1000, height: 1400 } });
await p.goto('file://' + process.argv[2]);
const el = await p.$(process.argv[4]);
await el.screenshot({ path: process.argv[3] });
await b.close();
