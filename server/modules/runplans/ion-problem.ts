/** The ion-transfer computations' rule errors as the API answers them: 422 naming the fields, the unknown names and the known ones. */
import { IonTransferError } from "@shared/domain/ion-transfer";
import { RuleBroken } from "../../errors";

/** An IonTransferError as a 422 problem; `prefix` puts the fields under a part of the request ("aqueous[0]"). */
export function ionProblem(e: IonTransferError, rename: (field: string) => string = (f) => f): RuleBroken {
  const fields = e.fields.length ? e.fields : [e.field];
  return new RuleBroken(
    e.message,
    fields.map((f) => ({ path: rename(f).replace(/\[(\d+)\]/g, ".$1"), message: e.message })),
    e.code,
    { unknown: [...e.unknown], known: [...e.known] },
  );
}

/** Runs a pure computation and answers its IonTransferError as 422. */
export function withIonProblems<T>(work: () => T, rename?: (field: string) => string): T {
  try {
    return work();
  } catch (e) {
    if (e instanceof IonTransferError) throw ionProblem(e, rename);
    throw e;
  }
}
