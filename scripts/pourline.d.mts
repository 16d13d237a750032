// Types of what scripts/pourline.mjs (plain Node, no build step) lends to TypeScript scripts.
export function logToStderr(): void;
export function startThrowawayApp(options?: { chromium?: boolean; worker?: boolean; quietApp?: boolean }): Promise<{ env: Record<string, string>; serverPid: number | undefined }>;
export function shutdown(code: number): Promise<never>;
export function failureMessage(e: unknown): string;
