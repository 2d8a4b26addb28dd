import { Linking } from 'react-native';

/** Opens the payment page outside the app. */
export function openPaymentPage(url: string) {
  void Linking.openURL(url);
}
