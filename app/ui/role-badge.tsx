// A member's role shown as an icon and a word (never by colour alone).
import { ROLE_LABELS, type Role } from "../projects/permissions";
import { ClipboardIcon, CompassIcon, SquareIcon, WrenchIcon } from "./icons";

const ICONS: Record<Role, typeof WrenchIcon> = {
  site_plumber: WrenchIcon,
  engineer: CompassIcon,
  architect: SquareIcon,
  manager: ClipboardIcon,
};

export function RoleBadge({ role }: { role: Role }) {
  const Icon = ICONS[role];
  return (
    <span className="inline-flex items-center gap-1.5 rounded-full border border-rule bg-paper px-2.5 py-0.5 text-xs font-semibold text-ink">
      <Icon className="text-copper" />
      {ROLE_LABELS[role]}
    </span>
  );
}
