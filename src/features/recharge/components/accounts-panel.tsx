/**
 * Accounts and who may charge them: the group lead (or the manager) adds people by e-mail with an
 * optional monthly cap, changes the cap or removes them; the manager enters credits with a reason.
 * A person of another organisation than the account's is refused (422); the manager may then add
 * them as an exception, saying why. What is offered follows each account's `abilities`.
 */
import { useState } from "react";
import { ORGANISATION_MISMATCH_CODES, type AccountDto } from "@shared/schemas/recharge";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Input } from "@/components/ui/input";
import { Table, TBody, Td, Th, THead, Tr } from "@/components/ui/table";
import { isApiError } from "@/lib/api-client";
import { useAccounts, useAddAdjustment, useAddMember, useMembers, useRemoveMember, useUpdateMember } from "../api/accounts";
import { money, parseDollars } from "./money";

export function AccountsPanel() {
  const accounts = useAccounts();
  const [open, setOpen] = useState<number | null>(null);
  const selected = accounts.data?.items.find((a) => a.id === open) ?? null;
  return (
    <div className="flex flex-col gap-4">
      <Card title="Accounts">
        <Table caption="Accounts">
          <THead>
            <Tr>
              <Th>Code</Th>
              <Th>Name</Th>
              <Th>Kind</Th>
              <Th>Owner</Th>
              <Th>Valid</Th>
              <Th />
            </Tr>
          </THead>
          <TBody>
            {accounts.data?.items.map((a) => (
              <Tr key={a.id}>
                <Td className="font-mono text-xs">{a.code}</Td>
                <Td>{a.name}</Td>
                <Td>{a.kind === "internal" ? "internal" : `external (${a.customerClass.replace("_", " ")})`}</Td>
                <Td>{a.ownerName ?? a.billingEmail ?? "—"}</Td>
                <Td>
                  <Badge tone={a.chargeable ? "ok" : "neutral"}>{a.chargeable ? "open" : "closed"}</Badge>
                  <span className="ml-1 text-xs text-grey-600">
                    {a.validFrom ?? "…"} – {a.validTo ?? "…"}
                  </span>
                </Td>
                <Td>
                  {a.abilities.manageMembers && (
                    <Button type="button" size="sm" variant="ghost" onClick={() => setOpen(a.id)}>
                      Manage
                    </Button>
                  )}
                </Td>
              </Tr>
            ))}
          </TBody>
        </Table>
      </Card>
      {selected && <AccountDetail key={selected.id} account={selected} />}
    </div>
  );
}

const MISMATCH: readonly string[] = ORGANISATION_MISMATCH_CODES;

function AccountDetail({ account }: { account: AccountDto }) {
  const members = useMembers(account.id);
  const add = useAddMember(account.id);
  const update = useUpdateMember(account.id);
  const remove = useRemoveMember(account.id);
  const adjust = useAddAdjustment(account.id);
  const [email, setEmail] = useState("");
  const [cap, setCap] = useState("");
  const [amount, setAmount] = useState("");
  const [reason, setReason] = useState("");
  const [exception, setException] = useState("");
  // The server refused the person as not of the account's organisation: the manager may say why they should charge it anyway.
  const mismatch = isApiError(add.error, 422) && add.error.code !== undefined && MISMATCH.includes(add.error.code);
  const offerException = mismatch && account.abilities.makeException;
  const capCents = cap.trim() === "" ? null : parseDollars(cap);
  const amountCents = parseDollars(amount);
  return (
    <Card title={`${account.code} — who may charge it`}>
      <Table caption="People who may charge this account">
        <THead>
          <Tr>
            <Th>Person</Th>
            <Th>Monthly cap</Th>
            <Th>Exception</Th>
            <Th />
          </Tr>
        </THead>
        <TBody>
          {members.data?.items.map((m) => (
            <Tr key={m.userId}>
              <Td>
                {m.name} <span className="text-xs text-grey-600">{m.email}</span>
              </Td>
              <Td>{m.monthlyCapCents == null ? "no cap" : money(m.monthlyCapCents)}</Td>
              <Td className="text-xs text-grey-700" data-testid={`member-exception-${m.userId}`}>
                {m.exceptionReason ?? "—"}
              </Td>
              <Td className="flex gap-1">
                <Button
                  type="button"
                  size="sm"
                  variant="ghost"
                  onClick={() => {
                    const v = window.prompt("Monthly cap (empty for none)", m.monthlyCapCents == null ? "" : String(m.monthlyCapCents / 100));
                    if (v === null) return;
                    update.mutate({ userId: m.userId, monthlyCapCents: v.trim() === "" ? null : parseDollars(v) });
                  }}
                >
                  Cap…
                </Button>
                <Button type="button" size="sm" variant="ghost" onClick={() => remove.mutate(m.userId)}>
                  Remove
                </Button>
              </Td>
            </Tr>
          ))}
        </TBody>
      </Table>
      {account.abilities.addMember ? (
        <form
          className="mt-3 flex flex-wrap items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            const exceptionReason = offerException && exception.trim() ? exception.trim() : undefined;
            add.mutate(
              { email, monthlyCapCents: capCents, exceptionReason },
              {
                onSuccess: () => {
                  setEmail("");
                  setException("");
                },
              },
            );
          }}
        >
          <Input label="Add a person (e-mail)" type="email" value={email} onChange={(e) => setEmail(e.target.value)} />
          <Input label="Monthly cap (optional)" value={cap} onChange={(e) => setCap(e.target.value)} error={cap && capCents === null ? "Give an amount like 400.00" : undefined} />
          {offerException && (
            <Input
              label="Exception: why"
              id="member-exception"
              value={exception}
              onChange={(e) => setException(e.target.value)}
              hint="Why this person may charge an account of another organisation; kept with the membership and in the audit log."
              fieldClassName="min-w-72"
            />
          )}
          <Button type="submit" variant="primary" disabled={!email || (cap !== "" && capCents === null)}>
            {offerException && exception.trim() ? "Allow as an exception" : "Allow to charge"}
          </Button>
        </form>
      ) : (
        <p className="mt-3 text-sm text-grey-600">This account is closed or past its validity dates; nobody new may charge it.</p>
      )}
      {(add.error || update.error || remove.error) && <Alert tone="danger" className="mt-2">{(add.error ?? update.error ?? remove.error)!.message}</Alert>}
      {account.abilities.adjust && (
        <form
          className="mt-4 flex flex-wrap items-end gap-2 border-t border-grey-100 pt-3"
          onSubmit={(e) => {
            e.preventDefault();
            if (amountCents !== null) adjust.mutate({ amountCents, reason }, { onSuccess: () => { setAmount(""); setReason(""); } });
          }}
        >
          <Input label="Credit (−) or charge (+)" value={amount} onChange={(e) => setAmount(e.target.value)} hint="e.g. -25.00 for a credit" />
          <Input label="Reason" value={reason} onChange={(e) => setReason(e.target.value)} />
          <Button type="submit" disabled={amountCents === null || amountCents === 0 || reason.trim().length < 3}>
            Enter adjustment
          </Button>
          {adjust.isSuccess && <Alert tone="ok">It will appear on the next statement of this account.</Alert>}
          {adjust.error && <Alert tone="danger">{adjust.error.message}</Alert>}
        </form>
      )}
    </Card>
  );
}
