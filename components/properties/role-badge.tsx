import { ROLE_LABELS, type Role } from '@/lib/validations/membership';
import { cn } from '@/components/ui/cn';

const STYLE: Record<Role, string> = {
  owner: 'bg-clover-light text-clover-dark',
  manager: 'bg-rain-light text-rain',
  member: 'bg-straw-light text-loam',
  viewer: 'bg-frost-light text-loam-soft',
};

/** The role in words as well as colour. */
export function RoleBadge({ role, className }: { role: Role; className?: string }) {
  return (
    <span className={cn('inline-flex items-center rounded-full px-2.5 py-0.5 text-xs font-semibold', STYLE[role], className)}>
      {ROLE_LABELS[role]}
    </span>
  );
}
