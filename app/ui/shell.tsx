// The page frame: the wordmark, where you can go, and who you are.
import type { ReactNode } from "react";
import { Form, Link, NavLink } from "react-router";
import type { CurrentUser } from "../accounts/context";
import { Mark, PersonIcon } from "./icons";

export function Shell({ user, children }: { user: CurrentUser | null; children: ReactNode }) {
  return (
    <div className="flex min-h-dvh flex-col">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-sheet focus:px-3 focus:py-2">
        Skip to content
      </a>
      <header className="border-b border-rule bg-sheet/80 backdrop-blur">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3">
          <Link to={user ? "/projects" : "/"} className="flex items-center gap-2 text-lg font-bold tracking-tight text-ink">
            <Mark className="text-2xl text-copper" />
            Countersign
          </Link>
          {user ? (
            <nav aria-label="Main" className="flex flex-1 items-center gap-1 text-sm font-medium">
              <NavItem to="/projects">My projects</NavItem>
              <NavItem to="/requests">Requests</NavItem>
              <span className="flex-1" />
              <NavItem to="/profile">
                <span className="inline-flex items-center gap-1.5">
                  <PersonIcon className="text-copper" />
                  <span className="hidden max-w-[14rem] truncate sm:inline">{user.name}</span>
                  <span className="sm:hidden">Profile</span>
                </span>
              </NavItem>
              <Form method="post" action="/sign-out">
                <button className="whitespace-nowrap rounded-md px-3 py-2 text-ink-soft hover:text-copper-deep">Sign out</button>
              </Form>
            </nav>
          ) : (
            <nav aria-label="Main" className="ml-auto flex items-center gap-1 text-sm font-medium">
              <NavItem to="/sign-in">Sign in</NavItem>
              <NavItem to="/sign-up">Create account</NavItem>
            </nav>
          )}
        </div>
      </header>
      <main id="main" className="mx-auto w-full max-w-6xl flex-1 px-4 py-8">{children}</main>
      <footer className="border-t border-rule py-6 text-center text-xs text-ink-soft">
        Countersign records and checks rational designs; it supports, and never replaces, the judgement of a
        registered engineer, the applicable standards and local regulations.
      </footer>
    </div>
  );
}

function NavItem({ to, children }: { to: string; children: ReactNode }) {
  return (
    <NavLink
      to={to}
      className={({ isActive }) =>
        `whitespace-nowrap rounded-md px-3 py-2 hover:text-copper-deep ${isActive ? "text-copper-deep underline decoration-2 underline-offset-8" : "text-ink"}`
      }
    >
      {children}
    </NavLink>
  );
}

export function PageTitle({ title, lead, actions }: { title: string; lead?: ReactNode; actions?: ReactNode }) {
  return (
    <div className="mb-8 flex flex-wrap items-end justify-between gap-4">
      <div>
        <h1 className="text-3xl font-bold tracking-tight text-ink">{title}</h1>
        {lead ? <p className="mt-2 max-w-2xl text-ink-soft">{lead}</p> : null}
      </div>
      {actions}
    </div>
  );
}

export function Panel({ children, className = "" }: { children: ReactNode; className?: string }) {
  return <section className={`rounded-lg border border-rule bg-sheet p-5 shadow-sm sm:p-6 ${className}`}>{children}</section>;
}
