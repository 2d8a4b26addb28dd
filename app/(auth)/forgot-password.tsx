import { ForgotPasswordScreen } from '@/components/account/forgot-password-screen';

export default function ForgotPassword() {
  return <ForgotPasswordScreen />;
}
