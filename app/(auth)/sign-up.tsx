import { useLocalSearchParams } from 'expo-router';

import { SignUpScreen } from '@/components/account/sign-up-screen';

export default function SignUp() {
  const { join } = useLocalSearchParams<{ join?: string }>();
  return <SignUpScreen join={join} />;
}
