import { useEffect, useRef } from 'react';
import { useNavigate } from 'react-router-dom';
import { LoadingLine } from '@/components/ui/spinner';
import { useSignOut } from '../api/sign-out';

/**
 * Signing out is a navigation to this route, so a screen with unsaved changes can ask first
 * (its leave guard sees the navigation) before the session ends.
 */
export function SignOutPage() {
  const signOut = useSignOut();
  const navigate = useNavigate();
  const started = useRef(false);
  useEffect(() => {
    if (started.current) return;
    started.current = true;
    signOut.mutate(undefined, { onSettled: () => void navigate('/sign-in', { replace: true }) });
  }, [signOut, navigate]);
  return <LoadingLine label="Signing out…" />;
}
