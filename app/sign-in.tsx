import { SignInScreen } from '../components/sign-in/sign-in-screen';

export default function SignInRoute() {
  return <SignInScreen />;
}
