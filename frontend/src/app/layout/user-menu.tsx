import { useRef } from 'react';
import { Button } from 'primereact/button';
import { Menu } from 'primereact/menu';
import type { MenuItem } from 'primereact/menuitem';
import { ROLE_LABELS } from '@loambook/common';
import { useAuth, useCurrentUser } from '@/features/auth/auth-provider';
import { useMediaQuery, WIDE_SCREEN } from '@/lib/use-media-query';

const initials = (name: string) =>
  name
    .split(/\s+/)
    .filter(Boolean)
    .slice(0, 2)
    .map((part) => part[0]?.toUpperCase() ?? '')
    .join('');

export function UserMenu() {
  const user = useCurrentUser();
  const { signOut } = useAuth();
  const menu = useRef<Menu>(null);
  // On a phone the button shows only the initials; the name is in the menu.
  const wide = useMediaQuery(WIDE_SCREEN);

  const items: MenuItem[] = [
    {
      template: () => (
        <div className="user-menu__who">
          <span className="user-menu__name">{user.name}</span>
          <span className="user-menu__role">{ROLE_LABELS[user.role]}</span>
          <span className="user-menu__email">{user.email}</span>
        </div>
      ),
    },
    { separator: true },
    { label: 'Sign out', icon: 'pi pi-sign-out', command: () => signOut('signed-out') },
  ];

  return (
    <>
      <Button
        type="button"
        className="user-menu__button"
        text
        aria-label="Account menu"
        aria-haspopup="menu"
        aria-controls="account-menu"
        onClick={(e) => menu.current?.toggle(e)}
      >
        <span className="avatar" aria-hidden="true">
          {initials(user.name)}
        </span>
        {wide ? (
          <span className="user-menu__button-text" aria-hidden="true">
            <span className="user-menu__button-name">{user.name}</span>
            <span className="user-menu__button-role">{ROLE_LABELS[user.role]}</span>
          </span>
        ) : null}
        <i className="pi pi-angle-down" aria-hidden="true" />
      </Button>
      <Menu model={items} popup ref={menu} id="account-menu" popupAlignment="right" className="user-menu" />
    </>
  );
}
