"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { sendJson, ApiError } from "@/lib/fetcher";

export function DeleteDatasetButton({ id, name }: { id: string; name: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  return (
    <span>
      <button
        type="button"
        className="text-sm font-medium text-alarm hover:underline"
        onClick={async () => {
          if (!window.confirm(`Delete ${name}? The uploaded file and its points are removed.`)) return;
          try {
            await sendJson(`/api/datasets/${id}`, "DELETE");
            router.refresh();
          } catch (err) {
            setError(err instanceof ApiError ? err.message : "Could not delete the file.");
          }
        }}
      >
        Delete
      </button>
      {error ? (
        <span role="alert" className="ml-2 text-xs text-alarm">
          {error}
        </span>
      ) : null}
    </span>
  );
}
