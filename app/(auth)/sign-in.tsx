import { SignInScreen } from '@/components/account/sign-in-screen';

export default function SignIn() {
  return <SignInScreen />;
}
