#!/usr/bin/env node
/**
 * Writes the invented data of every example scenario. Seeded, so the files are the same on every run:
 *   node examples/generate.mjs
 * (after `npm ci`, which builds dist/). The numbers are made up for demonstration; they describe no real
 * organisation. Random numbers come from src/data/synthetic.ts (mulberry32, Box–Muller).
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { mulberry32, normal } from '../dist/data/synthetic.js';

const here = dirname(fileURLToPath(import.meta.url));

function write(path, text) {
  mkdirSync(dirname(path), { recursive: true });
  writeFileSync(path, text);
}

function month(y, m) {
  return `${y}-${String(m).padStart(2, '0')}`;
}

/** Riverside Water: monthly deliveries in megalitres, summer peak, slow growth that eases off. */
export function waterDeliveries() {
  const rand = mulberry32(20260901);
  const rows = ['month,zone,delivered_ml'];
  let t = 0;
  for (let y = 2015; y <= 2026; y++) {
    for (let m = 1; m <= 12; m++) {
      if (y === 2026 && m > 9) break;
      const level = 4200 + 22 * t - 0.06 * t * t;
      const season = 620 * Math.cos((2 * Math.PI * (m - 7)) / 12) + 140 * Math.cos((4 * Math.PI * (m - 7)) / 12);
      const value = level + season + 70 * normal(rand);
      rows.push(`${month(y, m)},North,${value.toFixed(1)}`);
      rows.push(`${month(y, m)},South,${(0.62 * value + 40 * normal(rand)).toFixed(1)}`);
      t++;
    }
  }
  write(join(here, 'water-deliveries/data/deliveries.csv'), `${rows.join('\n')}\n`);
}

/** Lakeside Outfitters: monthly online orders, growing, season in proportion to the level, one outage. */
export function onlineOrders() {
  const rand = mulberry32(20260902);
  const rows = ['month,orders'];
  const factors = [0.86, 0.8, 0.92, 0.95, 0.98, 0.94, 0.9, 0.93, 0.97, 1.04, 1.26, 1.45];
  let t = 0;
  for (let y = 2016; y <= 2026; y++) {
    for (let m = 1; m <= 12; m++) {
      if (y === 2026 && m > 10) break;
      const level = 5200 * Math.exp(0.011 * t);
      let value = level * factors[m - 1] * Math.exp(0.025 * normal(rand));
      if (y === 2025 && m === 3) value *= 0.62; // a checkout outage in the story: one unusual month
      rows.push(`${month(y, m)},${Math.round(value)}`);
      t++;
    }
  }
  write(join(here, 'online-orders/data/orders.csv'), `${rows.join('\n')}\n`);
}

/** Three community clinics: daily visits with a weekly and a yearly pattern. */
export function clinicVisits() {
  const rand = mulberry32(20260903);
  const rows = ['date,site,visits'];
  const sites = [
    { name: 'Harbour Street', base: 180, growth: 0.012 },
    { name: 'Hillcrest', base: 120, growth: -0.004 },
    { name: 'Old Mill', base: 75, growth: 0.02 },
  ];
  const weekday = [1.18, 1.08, 1.02, 1.0, 0.96, 0.55, 0.3]; // Monday first
  const start = Date.UTC(2022, 0, 1);
  const end = Date.UTC(2026, 8, 30);
  for (let ms = start, d = 0; ms <= end; ms += 86_400_000, d++) {
    const date = new Date(ms);
    const iso = date.toISOString().slice(0, 10);
    const dow = (date.getUTCDay() + 6) % 7;
    const yearly = 1 + 0.16 * Math.cos((2 * Math.PI * (d - 20)) / 365.25);
    for (const s of sites) {
      const level = s.base * (1 + s.growth * (d / 365.25));
      const mean = level * weekday[dow] * yearly;
      rows.push(`${iso},${s.name},${Math.max(0, Math.round(mean + Math.sqrt(mean) * normal(rand)))}`);
    }
  }
  write(join(here, 'clinic-visits/data/visits.csv'), `${rows.join('\n')}\n`);
}

/**
 * Eastport Harbour: monthly freight handled in kilotonnes. The quays work Monday to Friday, so each working
 * day adds about 40 kt; a second container berth opened in March 2024 and lifted the level by about 600 kt;
 * a storm closed the port for most of November 2022 (a one-off).
 */
export function harbourFreight() {
  const rand = mulberry32(20261001);
  const rows = ['month,freight_kt'];
  let t = 0;
  for (let y = 2015; y <= 2026; y++) {
    for (let m = 1; m <= 12; m++) {
      if (y === 2026 && m > 10) break;
      let weekdays = 0;
      for (let d = 1; d <= new Date(Date.UTC(y, m, 0)).getUTCDate(); d++) {
        const dow = new Date(Date.UTC(y, m - 1, d)).getUTCDay();
        if (dow >= 1 && dow <= 5) weekdays++;
      }
      const level = 5200 + 9 * t + (y > 2024 || (y === 2024 && m >= 3) ? 600 : 0);
      const season = 260 * Math.cos((2 * Math.PI * (m - 10)) / 12);
      const storm = y === 2022 && m === 11 ? -900 : 0;
      const value = level + season + 40 * (weekdays - 21.7) + storm + 45 * normal(rand);
      rows.push(`${month(y, m)},${value.toFixed(1)}`);
      t++;
    }
  }
  write(join(here, 'harbour-freight/data/freight.csv'), `${rows.join('\n')}\n`);
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  harbourFreight();
  waterDeliveries();
  onlineOrders();
  clinicVisits();
}
