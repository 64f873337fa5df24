// Small line icons of our own, drawn on a 20×20 grid. Decorative unless given a title.
import type { SVGProps } from "react";

type IconProps = SVGProps<SVGSVGElement> & { title?: string };

function Icon({ title, children, ...props }: IconProps & { children: React.ReactNode }) {
  return (
    <svg viewBox="0 0 20 20" width="1em" height="1em" fill="none" stroke="currentColor" strokeWidth={1.6}
      strokeLinecap="round" strokeLinejoin="round" aria-hidden={title ? undefined : true} role={title ? "img" : undefined} {...props}>
      {title ? <title>{title}</title> : null}
      {children}
    </svg>
  );
}

/** The Countersign mark: a pipe bend meeting a seal. */
export const Mark = (p: IconProps) => (
  <Icon {...p} strokeWidth={1.8}>
    <path d="M3 4h6a5 5 0 0 1 5 5v8" />
    <circle cx="14" cy="6" r="3" />
  </Icon>
);
export const WrenchIcon = (p: IconProps) => (
  <Icon {...p}><path d="M12.5 3.5a3.5 3.5 0 0 0-3.3 4.6L3.5 13.8a1.7 1.7 0 0 0 2.4 2.4l5.7-5.7a3.5 3.5 0 0 0 4.6-3.3l-2 1-1.8-1.8 1-2z" /></Icon>
);
export const CompassIcon = (p: IconProps) => (
  <Icon {...p}><circle cx="10" cy="4" r="1.5" /><path d="M9.3 5.4 5 17M10.7 5.4 15 17M6.5 12.5h7" /></Icon>
);
export const SquareIcon = (p: IconProps) => (
  <Icon {...p}><path d="M4 3v14h13" /><path d="M4 12h5v5" /></Icon>
);
export const ClipboardIcon = (p: IconProps) => (
  <Icon {...p}><rect x="4.5" y="3.5" width="11" height="14" rx="1.5" /><path d="M7.5 3.5v2h5v-2M7.5 10h5M7.5 13h3" /></Icon>
);
export const CheckIcon = (p: IconProps) => <Icon {...p}><path d="m4 10.5 4 4 8-9" /></Icon>;
export const AlertIcon = (p: IconProps) => (
  <Icon {...p}><path d="M10 3 2.5 16.5h15L10 3z" /><path d="M10 8v4M10 14.5v.01" /></Icon>
);
export const ClockIcon = (p: IconProps) => <Icon {...p}><circle cx="10" cy="10" r="7" /><path d="M10 6v4l3 2" /></Icon>;
export const MailIcon = (p: IconProps) => <Icon {...p}><rect x="3" y="5" width="14" height="10" rx="1.5" /><path d="m3.5 6 6.5 5 6.5-5" /></Icon>;
export const PlusIcon = (p: IconProps) => <Icon {...p}><path d="M10 4v12M4 10h12" /></Icon>;
export const PersonIcon = (p: IconProps) => <Icon {...p}><circle cx="10" cy="7" r="3" /><path d="M4 17c.8-3 3.2-4.5 6-4.5s5.2 1.5 6 4.5" /></Icon>;
