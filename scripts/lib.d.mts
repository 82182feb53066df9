// Types for the parts of scripts/lib.mjs that TypeScript tests import.
export function appServerCommand(port: number, host?: string): [string, string[]];
export function bin(name: string): string;
export const root: string;
