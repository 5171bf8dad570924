import { useEffect, useRef, useState } from "react";
import type { PredictionResponse } from "~/engine";

export interface ApiProblem {
  code: string;
  message: string;
  field?: string;
}

export interface LivePrediction {
  /** The newest good answer and the request that produced it (kept while a later one fails). */
  result: { response: PredictionResponse; request: Record<string, unknown> } | null;
  /** The error of the newest request, if it failed. */
  problem: ApiProblem | null;
  busy: boolean;
}

const DEBOUNCE_MS = 250;

/**
 * Follows `request` with `POST /api/v1/predictions`: debounced while the user types, the
 * previous fetch aborted, and an answer older than the newest request dropped, so a slow
 * response can never overwrite a newer curve. `request` null means "nothing to send".
 */
export function useLivePrediction(request: Record<string, unknown> | null, localProblem: ApiProblem | null): LivePrediction {
  const [result, setResult] = useState<LivePrediction["result"]>(null);
  const [problem, setProblem] = useState<ApiProblem | null>(null);
  const [busy, setBusy] = useState(false);
  const seq = useRef(0);

  useEffect(() => {
    const mine = ++seq.current;
    if (request === null) {
      setProblem(localProblem);
      setBusy(false);
      return;
    }
    const ctrl = new AbortController();
    const timer = setTimeout(async () => {
      setBusy(true);
      try {
        const res = await fetch("/api/v1/predictions", {
          method: "POST",
          headers: { "content-type": "application/json", accept: "application/json" },
          body: JSON.stringify(request),
          signal: ctrl.signal,
        });
        const json = (await res.json().catch(() => null)) as PredictionResponse | { error: ApiProblem } | null;
        if (mine !== seq.current) return;
        if (json === null) setProblem({ code: "server", message: `The server answered ${res.status} without a readable body.` });
        else if ("error" in json) setProblem(json.error);
        else {
          setProblem(null);
          setResult({ response: json, request });
        }
      } catch (e) {
        if ((e as Error).name !== "AbortError" && mine === seq.current) setProblem({ code: "network", message: "The server did not answer." });
      } finally {
        if (mine === seq.current) setBusy(false);
      }
    }, DEBOUNCE_MS);
    return () => {
      clearTimeout(timer);
      ctrl.abort();
    };
  }, [request, localProblem]);

  return { result, problem, busy };
}
