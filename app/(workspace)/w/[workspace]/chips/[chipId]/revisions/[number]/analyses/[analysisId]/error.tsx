"use client";
import { Notice } from "@/components/ui/notice";

export default function ChipsError({ reset }: { error: Error; reset: () => void }) {
  return (
    <div className="space-y-4">
      <Notice tone="error" title="This page could not be shown">
        Something went wrong on our side while loading it. Nothing you entered was lost; try again, and if it keeps happening tell your admin.
      </Notice>
      <button type="button" className="btn-quiet" onClick={reset}>
        Try again
      </button>
    </div>
  );
}
