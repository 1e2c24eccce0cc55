import { useState } from "react";
import { useRouter } from "next/navigation";
import { apiFetch, ApiError } from "@/app/_components/api";

type Method = "POST" | "PATCH";

/** Send one request; on success refresh the page's server data, on failure keep the server's message and fields. */
export function useSend() {
  const router = useRouter();
  const [error, setError] = useState<{ message: string; fields: Record<string, string> } | null>(null);
  const [pending, setPending] = useState(false);
  async function send(url: string, method: Method, body: unknown): Promise<boolean> {
    setPending(true);
    setError(null);
    try {
      await apiFetch(url, { method, body });
      router.refresh();
      return true;
    } catch (e) {
      setError({ message: e instanceof Error ? e.message : "That did not work.", fields: e instanceof ApiError ? (e.fields ?? {}) : {} });
      return false;
    } finally {
      setPending(false);
    }
  }
  return { send, error, pending, setError };
}
