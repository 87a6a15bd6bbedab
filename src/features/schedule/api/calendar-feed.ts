/** The personal iCalendar feed: its secret URL (GET /api/calendar/me) and rotation (POST /api/calendar/me/rotate). */
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { calendarFeedDto } from "@shared/schemas/bookings";
import { api, parseResponse } from "@/lib/api-client";
import { scheduleKeys } from "./keys";

export const useCalendarFeed = () =>
  useQuery({
    queryKey: scheduleKeys.calendarFeed(),
    queryFn: async ({ signal }) => parseResponse(calendarFeedDto, await api.get<unknown>("/calendar/me", { signal }), "GET /api/calendar/me"),
  });

export function useRotateCalendarFeed() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async () => parseResponse(calendarFeedDto, await api.post<unknown>("/calendar/me/rotate"), "POST /api/calendar/me/rotate"),
    onSuccess: (data) => queryClient.setQueryData(scheduleKeys.calendarFeed(), data),
  });
}
