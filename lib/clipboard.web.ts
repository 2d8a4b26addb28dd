/** Puts text on the clipboard: true when copied, false when refused, null without the Clipboard API. */
export async function copyText(text: string): Promise<boolean | null> {
  if (!navigator.clipboard) return null;
  return navigator.clipboard.writeText(text).then(
    () => true,
    () => false,
  );
}
