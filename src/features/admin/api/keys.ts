/** Query keys for the administration screens; every input of a fetch is part of its key. */
import type { UserListQuery } from "@shared/schemas/users";

export const adminKeys = {
  all: ["admin"] as const,
  users: () => [...adminKeys.all, "users"] as const,
  userList: (q: Partial<UserListQuery>) => [...adminKeys.users(), "list", q] as const,
  // Under users: adding or editing a person may add an organisation.
  organisations: () => [...adminKeys.users(), "organisations"] as const,
  departments: () => [...adminKeys.all, "departments"] as const,
  groups: () => [...adminKeys.all, "groups"] as const,
  mailbox: () => [...adminKeys.all, "mailbox"] as const,
  systemStatus: () => [...adminKeys.all, "system-status"] as const,
};
