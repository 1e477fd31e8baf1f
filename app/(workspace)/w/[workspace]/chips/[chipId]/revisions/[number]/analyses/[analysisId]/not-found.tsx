import { EmptyState } from "@/components/ui/empty-state";

export default function ChipNotFound() {
  return (
    <EmptyState title="Not found in this workspace">
      <p>That chip, revision or analysis does not exist here. It may have been typed wrong in the address; go back to the chip list and pick it from there.</p>
    </EmptyState>
  );
}
