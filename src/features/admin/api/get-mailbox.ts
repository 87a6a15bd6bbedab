/** GET /api/dev/mailbox: what the local fake mailbox received (development only; 404 in production). */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { mailboxPageDto, type MailboxMessageDto, type MailboxPageDto } from "@shared/schemas/system";
import { api, parseResponse } from "@/lib/api-client";
import { adminKeys } from "./keys";

export type MailboxMessage = MailboxMessageDto;
export type MailboxPage = MailboxPageDto;

export async function getMailbox(signal?: AbortSignal): Promise<MailboxPage> {
  return parseResponse(mailboxPageDto, await api.get<unknown>("/dev/mailbox", { signal }), "GET /api/dev/mailbox");
}

export const mailboxQueryOptions = () =>
  queryOptions({
    queryKey: adminKeys.mailbox(),
    queryFn: ({ signal }) => getMailbox(signal),
    // New mail arrives while a developer clicks through a flow in another tab; a 404 (production) stops the polling.
    refetchInterval: (query) => (query.state.status === "error" ? false : 5_000),
  });

export const useMailbox = () => useQuery(mailboxQueryOptions());
