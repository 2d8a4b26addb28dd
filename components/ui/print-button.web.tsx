import { Button } from '@/components/ui/button';

/** Opens the browser's print dialog (Letter or A4, as the printer is set up). */
export function PrintButton() {
  return <Button label="Print" onPress={() => window.print()} testID="print-sheet" />;
}
