/** The personal iCalendar feed: its secret URL (GET /api/calendar/me) and rotation (POST /api/calendar/me/rotate). */
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { scheduleKeys } from "./keys";

export const useCalendarFeed = () =>
  useQuery({ queryKey: scheduleKeys.calendarFeed(), queryFn: ({ signal }) => api.get<{ url: string }>("/calendar/me", { signal }) });

export function useRotateCalendarFeed() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<{ url: string }>("/calendar/me/rotate"),
    onSuccess: (data) => queryClient.setQueryData(scheduleKeys.calendarFeed(), data),
  });
}
