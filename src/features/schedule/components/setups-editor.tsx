/**
 * The manager's setups: named sets of instruments booked together (a potentiostat with an
 * interface cell). Add, rename, change the instruments, or remove one; bookings already made
 * from a setup keep their instruments. The route passes the instruments in.
 */
import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { InstrumentDto } from "@shared/schemas/instruments";
import { setupInput, type SetupDto } from "@shared/schemas/setups";
import { applyServerFieldErrors, describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { FieldSet } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { LoadingLine } from "@/components/ui/spinner";
import { TBody, THead, Table, Td, Th, Tr } from "@/components/ui/table";
import { useConfirm } from "@/components/ui/confirm-dialog";
import { useSetups } from "../api/get-schedule-data";
import { useDeleteSetup, useSaveSetup } from "../api/setups";

type Editing = { setup: SetupDto | null } | null;

export function SetupsEditor({ instruments }: { instruments: InstrumentDto[] }) {
  const setups = useSetups();
  const remove = useDeleteSetup();
  const [editing, setEditing] = useState<Editing>(null);
  const [msg, setMsg] = useState<{ tone: "ok" | "danger"; text: string } | null>(null);
  const names = new Map(instruments.map((i) => [i.id, i.name]));
  const [confirmation, confirm] = useConfirm();

  const onDelete = async (s: SetupDto) => {
    const sure = await confirm({
      title: `Remove the setup “${s.name}”?`,
      description: "Bookings already made keep their instruments; the setup is no longer offered when booking.",
      confirmLabel: "Remove the setup",
      keepLabel: "Keep it",
    });
    if (!sure) return;
    setMsg(null);
    try {
      await remove.mutateAsync(s.id);
      setMsg({ tone: "ok", text: `Removed “${s.name}”.` });
    } catch (e) {
      setMsg({ tone: "danger", text: describeError(e) });
    }
  };

  if (setups.isPending) return <LoadingLine label="Loading setups" />;
  if (setups.isError) return <Alert tone="danger">{describeError(setups.error)}</Alert>;

  return (
    <div className="flex flex-col gap-3" data-testid="setups-editor">
      {confirmation}
      {msg && <Alert tone={msg.tone}>{msg.text}</Alert>}
      {setups.data.length === 0 ? (
        <EmptyState title="No setups yet">A setup lets people book a potentiostat and a cell in one step.</EmptyState>
      ) : (
        <Table caption="Setups">
          <THead>
            <tr>
              <Th>Name</Th>
              <Th>Instruments</Th>
              <Th>Description</Th>
              <Th className="text-right">Actions</Th>
            </tr>
          </THead>
          <TBody>
            {setups.data.map((s) => (
              <Tr key={s.id} data-testid={`setup-${s.id}`}>
                <Td>{s.name}</Td>
                <Td>{s.instrumentIds.map((id) => names.get(id) ?? `#${id}`).join(" + ")}</Td>
                <Td className="text-xs">{s.description || "—"}</Td>
                <Td className="text-right">
                  <div className="flex justify-end gap-2">
                    <Button size="sm" onClick={() => setEditing({ setup: s })}>
                      Edit
                    </Button>
                    <Button size="sm" variant="danger" onClick={() => onDelete(s)}>
                      Remove
                    </Button>
                  </div>
                </Td>
              </Tr>
            ))}
          </TBody>
        </Table>
      )}
      {editing ? (
        <SetupForm
          key={editing.setup?.id ?? "new"}
          setup={editing.setup}
          instruments={instruments}
          onDone={(text) => {
            setEditing(null);
            setMsg({ tone: "ok", text });
          }}
          onCancel={() => setEditing(null)}
        />
      ) : (
        <div>
          <Button variant="primary" onClick={() => setEditing({ setup: null })} data-testid="add-setup">
            Add a setup
          </Button>
        </div>
      )}
    </div>
  );
}

function SetupForm({
  setup,
  instruments,
  onDone,
  onCancel,
}: {
  setup: SetupDto | null;
  instruments: InstrumentDto[];
  onDone: (message: string) => void;
  onCancel: () => void;
}) {
  const save = useSaveSetup();
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm({
    resolver: zodResolver(setupInput),
    defaultValues: { name: setup?.name ?? "", description: setup?.description ?? "", instrumentIds: (setup?.instrumentIds ?? []).map(String) },
  });
  const errors = formState.errors;
  // Retired instruments cannot be booked, so a setup should not offer them; keep any already in it.
  const offered = instruments.filter((i) => i.status !== "retired" || setup?.instrumentIds.includes(i.id));

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      const saved = await save.mutateAsync({ id: setup?.id, input: values });
      onDone(setup ? `Saved “${saved.name}”.` : `Added “${saved.name}”.`);
    } catch (e) {
      if (!applyServerFieldErrors(e, setError, ["name", "description", "instrumentIds"])) setFormError(describeError(e));
    }
  });

  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-3 rounded border border-grey-200 p-3" data-testid="setup-form" noValidate>
      <h3 className="text-sm font-semibold">{setup ? `Edit “${setup.name}”` : "New setup"}</h3>
      <div className="grid gap-3 sm:grid-cols-2">
        <Input label="Name" {...register("name")} error={errors.name?.message} required data-testid="setup-name" />
        <Input label="Description" {...register("description")} error={errors.description?.message} />
      </div>
      <FieldSet legend="Instruments (at least two, booked together)" id="setup-instruments" error={errors.instrumentIds?.message}>
        <div className="grid max-h-48 gap-1 overflow-y-auto rounded border border-grey-200 p-2 sm:grid-cols-2">
          {offered.map((i) => (
            <label key={i.id} className="flex items-center gap-1.5 text-sm">
              <input type="checkbox" value={String(i.id)} {...register("instrumentIds")} />
              {i.name}
            </label>
          ))}
        </div>
      </FieldSet>
      {formError && <Alert tone="danger">{formError}</Alert>}
      <div className="flex justify-end gap-2">
        <Button onClick={onCancel}>Cancel</Button>
        <Button type="submit" variant="primary" loading={save.isPending} data-testid="setup-save">
          {setup ? "Save setup" : "Add setup"}
        </Button>
      </div>
    </form>
  );
}
