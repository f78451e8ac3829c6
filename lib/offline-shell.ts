/** Native apps carry their files with them: nothing to do. The web build uses offline-shell.web.ts. */
export function registerOfflineShell(): void {}
