/**
 * Puts text on the clipboard. Only the web build ships (app.json `platforms`), and React Native
 * has no clipboard of its own, so elsewhere there is nothing to copy to: `null`, like a browser
 * without the Clipboard API.
 */
export async function copyText(_text: string): Promise<boolean | null> {
  return null;
}
