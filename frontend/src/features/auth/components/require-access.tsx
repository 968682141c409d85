import type { ReactNode } from 'react';
import type { AppAbility } from '@loambook/common';
import { Forbidden } from '@/app/routes/forbidden';
import { useAppAbility } from '../ability';

/** Shows the page only when the person's ability allows it, and says so plainly when it does not. */
export function RequireAccess({
  allow,
  children,
}: {
  allow: (ability: AppAbility) => boolean;
  children: ReactNode;
}) {
  const ability = useAppAbility();
  if (!allow(ability)) return <Forbidden />;
  return <>{children}</>;
}
