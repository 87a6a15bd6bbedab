/**
 * What the Schedule's screens need from outside the schedule feature: the facility's zone and
 * the instruments. The routes fetch them here and pass them in, so features stay apart (STYLE 7).
 */
import { useMemo } from "react";
import type { InstrumentDto } from "@shared/schemas/instruments";
import { useFacility } from "@/lib/facility";
import { useInstruments } from "@/features/instruments/api/get-instruments";

export interface ScheduleContext {
  zone: string | undefined;
  instruments: InstrumentDto[];
  names: ReadonlyMap<number, string>;
  /** True until both the zone and the instruments are known. */
  loading: boolean;
  error: unknown;
}

export function useScheduleContext(): ScheduleContext {
  const facility = useFacility();
  const list = useInstruments({ limit: 500 });
  const instruments = useMemo(() => list.data?.items ?? [], [list.data]);
  const names = useMemo(() => new Map(instruments.map((i) => [i.id, i.name])), [instruments]);
  return {
    zone: facility.data?.timeZone,
    instruments,
    names,
    loading: facility.isPending || list.isPending,
    error: facility.error ?? list.error,
  };
}
