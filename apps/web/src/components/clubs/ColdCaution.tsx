import { Snowflake } from 'lucide-react';
import { Notice } from '../Notice';

/** Shown wherever frozen stock is put away, taken out or carried. */
export function ColdCaution({ className }: { className?: string }) {
  return (
    <Notice tone="warning" word="Caution" title="Handling frozen stock" className={className}>
      <span className="inline-flex items-start gap-2">
        <Snowflake aria-hidden className="mt-1 size-4 shrink-0" />
        <span>
          Dry ice, liquid nitrogen and vials straight from a −70 °C or −80 °C freezer burn skin: wear insulated gloves
          and eye protection. Never close dry ice or liquid nitrogen in an airtight box or jar, where the gas builds
          pressure until it bursts, and only use them where fresh air comes in, since the gas pushes out the air you
          breathe. Carry vials in an open, insulated cooler. Follow your local codes and the supplier’s label and safety
          sheet; they come first.
        </span>
      </span>
    </Notice>
  );
}

export const isFrozenForm = (form: string | null | undefined) => form === 'frozen_glycerol';
