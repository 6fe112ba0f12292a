/** The package's version, read when asked, so a command that never prints it never reads package.json. */
export async function toolVersion(): Promise<string> {
  const { readFileSync } = await import('node:fs');
  const pkg = JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { version: string };
  return pkg.version;
}
