// Console output of the orchestration scripts.
export const step = (message: string) => console.log(`▸ ${message}`);
export const ok = (message: string) => console.log(`✔ ${message}`);
export const warn = (message: string) => console.warn(`! ${message}`);
export function failAndExit(message: string, code = 1): never {
  console.error(`\n✖ ${message}\n`);
  process.exit(code);
}
