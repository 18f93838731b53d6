import { SignOutButton } from '@/components/auth/sign-out-button';
import { Wordmark } from './wordmark';
import { NavLink } from './nav-link';

export function AppHeader({ userName }: { userName: string }) {
  // Phones: mark and sign-out on the first row, navigation and name on the second. Wider: one row.
  return (
    <header className="border-b border-ground-line bg-ground-raised/90">
      <div className="mx-auto flex max-w-5xl flex-wrap items-center gap-x-4 gap-y-1 px-4 py-2 sm:gap-x-6 sm:px-6">
        <Wordmark href="/dashboard" className="order-1" />
        <div className="order-2 ml-auto sm:order-4 sm:ml-0">
          <SignOutButton />
        </div>
        <div className="order-3 basis-full sm:hidden" aria-hidden="true" />
        {/* On a phone the row scrolls sideways rather than pushing the page wider than the screen. */}
        <nav aria-label="Main" className="order-4 -mx-4 w-[calc(100%+2rem)] overflow-x-auto px-4 sm:order-2 sm:mx-0 sm:w-auto sm:overflow-visible sm:px-0">
          <ul className="flex gap-1 whitespace-nowrap">
            <li>
              <NavLink href="/dashboard">Today</NavLink>
            </li>
            <li>
              <NavLink href="/my-steps">My steps</NavLink>
            </li>
            <li>
              <NavLink href="/calendar">Calendar</NavLink>
            </li>
            <li>
              <NavLink href="/properties">Properties</NavLink>
            </li>
            <li>
              <NavLink href="/settings">Settings</NavLink>
            </li>
          </ul>
        </nav>
        <p className="order-5 ml-auto min-w-0 max-w-48 truncate text-sm text-loam-soft sm:order-3 sm:max-w-64" title={userName}>
          <span className="sr-only">Signed in as </span>
          {userName}
        </p>
      </div>
    </header>
  );
}
