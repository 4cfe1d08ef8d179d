import Link from "next/link";
import { EmptyState } from "@/components/ui/card";

export default function BaselineNotFound() {
  return (
    <EmptyState
      title="Baseline not found"
      action={
        <Link href="/teams" className="text-copper hover:underline">
          Back to your teams
        </Link>
      }
    >
      It may have been deleted, or it belongs to a team you are not a member of.
    </EmptyState>
  );
}
