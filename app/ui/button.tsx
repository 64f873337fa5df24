// Buttons and button-styled links: one primary (copper), one quiet, one for destructive actions.
import type { ButtonHTMLAttributes } from "react";
import { Link, type LinkProps } from "react-router";

const base =
  "inline-flex items-center justify-center gap-2 rounded-md px-4 py-2.5 text-sm font-semibold transition " +
  "disabled:cursor-not-allowed disabled:opacity-60";
const styles = {
  primary: "bg-copper text-white shadow-sm hover:bg-copper-deep",
  quiet: "border border-rule bg-sheet text-ink hover:border-copper hover:text-copper-deep",
  danger: "border border-fail/40 bg-sheet text-fail hover:bg-fail hover:text-white",
} as const;
type Variant = keyof typeof styles;

export function Button({ variant = "primary", className = "", ...props }: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return <button {...props} className={`${base} ${styles[variant]} ${className}`} />;
}

export function ButtonLink({ variant = "primary", className = "", ...props }: LinkProps & { variant?: Variant }) {
  return <Link {...props} className={`${base} ${styles[variant]} ${className}`} />;
}
