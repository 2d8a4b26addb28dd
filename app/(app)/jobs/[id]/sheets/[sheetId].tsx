import { useLocalSearchParams } from 'expo-router';

import { SheetScreen } from '@/components/sheet/sheet-screen';

export default function SheetPage() {
  const { id, sheetId } = useLocalSearchParams<{ id: string; sheetId: string }>();
  return <SheetScreen id={id} sheetId={sheetId} />;
}
