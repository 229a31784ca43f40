/** A device's upkeep and, for a smoke, heat or CO device not set up to protect, the words that say so. */
import { ShieldOff } from 'lucide-react';
import { Badge } from '@/components/ui/badge';
import { cn } from '@/lib/cn';
import type { PortalDevice } from '@/types/api';
import { deviceLifeWords, isNotProtecting, NOT_PROTECTING } from '../life-words';

/** Its upkeep in words; long words wrap on a phone rather than run off the card. */
export function LifeBadge({ device, className }: { device: Pick<PortalDevice, 'life' | 'lifeSafety'>; className?: string }) {
  const words = deviceLifeWords(device);
  return (
    <Badge tone={words.tone} className={cn('whitespace-normal!', className)}>
      {words.text}
    </Badge>
  );
}

/** "Not protecting", with its own mark, for a smoke, heat or CO device whose zone does not protect. */
export function NotProtectingBadge({ className }: { className?: string }) {
  return (
    <Badge tone="bad" className={className}>
      <ShieldOff className="size-3" aria-hidden="true" />
      {NOT_PROTECTING}
    </Badge>
  );
}

/** The badges of a device: "Not protecting" first when it applies, then its upkeep. */
export function DeviceBadges({ device, className }: { device: Pick<PortalDevice, 'life' | 'lifeSafety' | 'protects'>; className?: string }) {
  return (
    <span className={cn('flex flex-wrap items-center justify-end gap-1.5', className)}>
      {isNotProtecting(device) && <NotProtectingBadge />}
      <LifeBadge device={device} />
    </span>
  );
}
