// Imports the built holidays module, reports whether date-holidays is loaded, calls it, reports again.
import { createRequire } from 'node:module';

const cache = createRequire(import.meta.url).cache;
const loaded = () => Object.keys(cache).some((k) => k.includes('/node_modules/date-holidays/'));
const { publicHolidays } = await import(process.argv[2]);
const before = loaded();
const got = publicHolidays('GB-ENG', 2024, 2024);
console.log(JSON.stringify({ before, after: loaded(), days: got.days.size }));
