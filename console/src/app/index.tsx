import { SignInGate } from '../features/auth/components/sign-in-gate';
import { AppProvider } from './provider';
import { AppRouter } from './router';

export function App() {
  return (
    <AppProvider>
      <SignInGate>
        <AppRouter />
      </SignInGate>
    </AppProvider>
  );
}
