/**
 * GET /api/dev/mailbox: what the local fake mailbox received (development only; 404 in
 * production). No shared schema describes it yet because it is a development aid, so the shape
 * is declared here from the API note.
 */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { adminKeys } from "./keys";

export interface MailboxMessage {
  id: string;
  from: string | null;
  to: string[];
  subject: string;
  text: string;
  html?: string | null;
  date: string;
}

export interface MailboxPage {
  items: MailboxMessage[];
  total: number;
}

export function getMailbox(signal?: AbortSignal): Promise<MailboxPage> {
  return api.get<MailboxPage>("/dev/mailbox", { signal });
}

export const mailboxQueryOptions = () =>
  queryOptions({
    queryKey: adminKeys.mailbox(),
    queryFn: ({ signal }) => getMailbox(signal),
    // New mail arrives while a developer clicks through a flow in another tab; a 404 (production) stops the polling.
    refetchInterval: (query) => (query.state.status === "error" ? false : 5_000),
  });

export const useMailbox = () => useQuery(mailboxQueryOptions());
