/** React Native Web has no Alert; the browser's own dialog is accessible and blocks as it should. */
export function confirmAction(title: string, message: string, _confirmLabel: string): Promise<boolean> {
  return Promise.resolve(window.confirm(`${title}\n\n${message}`));
}
