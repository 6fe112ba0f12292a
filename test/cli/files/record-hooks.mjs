import { appendFileSync } from 'node:fs';

export async function resolve(specifier, context, next) {
  const result = await next(specifier, context);
  appendFileSync(process.env.IMPORT_LOG, `${result.url}\n`);
  return result;
}
