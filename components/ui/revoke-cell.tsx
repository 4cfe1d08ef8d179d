"use client";
import { Button } from "@/components/ui/button";

/** The last cell of a row of revocable links (invites, share links): a "Revoke" button while the link is live. */
export function RevokeCell({
  live,
  onRevoke,
  label,
  disabled,
  className,
}: {
  live: boolean;
  onRevoke: () => void;
  label: string;
  disabled?: boolean;
  className: string;
}) {
  return (
    <td className={`${className} text-right`}>
      {live ? (
        <Button variant="ghost" onClick={onRevoke} disabled={disabled} aria-label={label}>
          Revoke
        </Button>
      ) : null}
    </td>
  );
}
