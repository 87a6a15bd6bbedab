/**
 * The shared UI pieces (src/components/ui) as a person and a screen reader meet them: names,
 * states in words, errors tied to their fields, dialogs that open, name themselves and close.
 */
import { useMemo, useState } from "react";
import { describe, expect, it, vi } from "vitest";
import { render, screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { useConfirm } from "@/components/ui/confirm-dialog";
import { Dialog } from "@/components/ui/dialog";
import { EmptyState } from "@/components/ui/empty-state";
import { FieldSet } from "@/components/ui/field";
import { Checkbox, Input, Select } from "@/components/ui/input";
import { PageHeader } from "@/components/ui/page-header";
import { FullPageSpinner, Spinner } from "@/components/ui/spinner";
import { createColumnHelper, getCoreRowModel, useReactTable } from "@tanstack/react-table";
import { BodyRows, Pager, SortableTh, Table, TBody, THead, Td, Tr } from "@/components/ui/table";

describe("Button", () => {
  it("is a plain button by default and runs its action on Enter or a click", async () => {
    const onClick = vi.fn();
    render(<Button onClick={onClick}>Approve</Button>);
    const button = screen.getByRole("button", { name: "Approve" });
    expect(button.getAttribute("type")).toBe("button");
    await userEvent.click(button);
    button.focus();
    await userEvent.keyboard("{Enter}");
    expect(onClick).toHaveBeenCalledTimes(2);
  });

  it("while loading says it is busy and takes no second press", async () => {
    const onClick = vi.fn();
    render(
      <Button loading onClick={onClick}>
        Book
      </Button>,
    );
    const button = screen.getByRole("button", { name: "Book" });
    expect(button.getAttribute("aria-busy")).toBe("true");
    expect((button as HTMLButtonElement).disabled).toBe(true);
    await userEvent.click(button);
    expect(onClick).not.toHaveBeenCalled();
  });
});

describe("Input, Select and Checkbox", () => {
  it("names the input by its label and reads its hint", () => {
    render(<Input label="Final volume (mL)" hint="Up to the flask's mark." required />);
    const input = screen.getByLabelText(/Final volume \(mL\)/);
    expect(input.getAttribute("aria-required")).toBe("true");
    expect(input.getAttribute("aria-invalid")).toBeNull();
    const hint = document.getElementById(input.getAttribute("aria-describedby")!);
    expect(hint?.textContent).toBe("Up to the flask's mark.");
  });

  it("puts the error in words next to the field, marks it invalid and replaces the hint", () => {
    render(<Input label="Amount used" hint="In any unit" error="Enter an amount above zero" />);
    const input = screen.getByLabelText("Amount used");
    expect(input.getAttribute("aria-invalid")).toBe("true");
    const described = input.getAttribute("aria-describedby")!.split(" ").map((id) => document.getElementById(id)?.textContent);
    expect(described).toEqual(["Enter an amount above zero"]);
    expect(screen.queryByText("In any unit")).toBeNull();
  });

  it("lets a select be chosen by its label, and a checkbox toggled by its label", async () => {
    const Both = () => {
      const [unit, setUnit] = useState("mL");
      return (
        <>
          <Select label="Unit" value={unit} onChange={(e) => setUnit(e.target.value)}>
            <option value="mL">mL</option>
            <option value="g">g</option>
          </Select>
          <Checkbox label="After hours" />
        </>
      );
    };
    render(<Both />);
    await userEvent.selectOptions(screen.getByLabelText("Unit"), "g");
    expect((screen.getByLabelText("Unit") as HTMLSelectElement).value).toBe("g");
    const box = screen.getByLabelText("After hours") as HTMLInputElement;
    await userEvent.click(screen.getByText("After hours"));
    expect(box.checked).toBe(true);
  });

  it("groups checkboxes under one legend with one error", () => {
    render(
      <FieldSet legend="Instruments" id="pick" error="Choose at least one instrument">
        <Checkbox label="Potentiostat A" />
      </FieldSet>,
    );
    const group = screen.getByRole("group", { name: "Instruments" });
    expect(group.getAttribute("aria-invalid")).toBe("true");
    expect(document.getElementById(group.getAttribute("aria-describedby")!)?.textContent).toBe("Choose at least one instrument");
  });
});

describe("Alert and Badge", () => {
  it("announces an error as an alert and other news as a status, each with its word for screen readers", () => {
    render(
      <>
        <Alert tone="danger">Not moved: the cell is being cleaned</Alert>
        <Alert tone="ok">Booking moved.</Alert>
      </>,
    );
    expect(screen.getByRole("alert").textContent).toBe("Error: Not moved: the cell is being cleaned");
    expect(screen.getByRole("status").textContent).toBe("Done: Booking moved.");
  });

  it("shows a state in words, whatever its tint", () => {
    render(<Badge tone="warning">Requested</Badge>);
    expect(screen.getByText("Requested")).toBeTruthy();
  });
});

describe("Dialog", () => {
  function Opener() {
    const [open, setOpen] = useState(false);
    return (
      <>
        <Button onClick={() => setOpen(true)}>Book a slot</Button>
        <Dialog open={open} onClose={() => setOpen(false)} title="Book this slot" description="Times are the facility's.">
          <Input label="Purpose" />
        </Dialog>
      </>
    );
  }

  it("opens named by its title, shows its content, and closes with its close button", async () => {
    render(<Opener />);
    expect(screen.queryByRole("dialog")).toBeNull();
    await userEvent.click(screen.getByRole("button", { name: "Book a slot" }));
    const dialog = screen.getByRole("dialog", { name: "Book this slot" });
    expect(dialog.hasAttribute("open")).toBe(true);
    expect(within(dialog).getByLabelText("Purpose")).toBeTruthy();
    await userEvent.click(within(dialog).getByRole("button", { name: "Close" }));
    expect(screen.queryByRole("dialog")).toBeNull();
  });

  it("closes on Escape (the dialog's cancel)", async () => {
    render(<Opener />);
    await userEvent.click(screen.getByRole("button", { name: "Book a slot" }));
    const dialog = screen.getByRole("dialog", { name: "Book this slot" });
    dialog.dispatchEvent(new Event("cancel", { cancelable: true }));
    await vi.waitFor(() => expect(screen.queryByRole("dialog")).toBeNull());
  });
});

describe("useConfirm", () => {
  function Cancel({ onAnswer }: { onAnswer: (yes: boolean) => void }) {
    const [confirmation, confirm] = useConfirm();
    return (
      <>
        <Button onClick={async () => onAnswer(await confirm({ title: "Cancel this booking?", confirmLabel: "Cancel the booking", keepLabel: "Keep it" }))}>Cancel…</Button>
        {confirmation}
      </>
    );
  }

  it("asks in the page's own dialog with the action's words, and answers what the person chose", async () => {
    const answers: boolean[] = [];
    render(<Cancel onAnswer={(a) => answers.push(a)} />);
    await userEvent.click(screen.getByRole("button", { name: "Cancel…" }));
    await userEvent.click(screen.getByRole("button", { name: "Keep it" }));
    await userEvent.click(screen.getByRole("button", { name: "Cancel…" }));
    await userEvent.click(screen.getByRole("button", { name: "Cancel the booking" }));
    await vi.waitFor(() => expect(answers).toEqual([false, true]));
  });
});

describe("Card, PageHeader, EmptyState and Spinner", () => {
  it("gives a card a heading at the level asked for", () => {
    render(
      <Card title="Booking rules" as="h3">
        Rules
      </Card>,
    );
    expect(screen.getByRole("heading", { level: 3, name: "Booking rules" })).toBeTruthy();
  });

  it("gives the page its one h1 and the browser tab its title", () => {
    render(<PageHeader title="Stockroom" description="Every container" />);
    expect(screen.getByRole("heading", { level: 1, name: "Stockroom" })).toBeTruthy();
    expect(document.querySelector("title")?.textContent).toBe("Stockroom · Phasebook");
  });

  it("says what would be in an empty list", () => {
    render(<EmptyState title="No requests waiting">Requests on instruments that need approval appear here.</EmptyState>);
    expect(screen.getByText("No requests waiting")).toBeTruthy();
  });

  it("tells screen readers what is loading", () => {
    render(
      <>
        <Spinner label="Saving" />
        <FullPageSpinner label="Checking your session" />
      </>,
    );
    expect(screen.getByRole("status").textContent).toBe("Saving");
    expect(screen.getByText("Checking your session…")).toBeTruthy();
  });
});

describe("Table", () => {
  it("tells the sort order of a sortable column and flips it with its button", async () => {
    const onToggle = vi.fn();
    render(
      <Table caption="Containers">
        <THead>
          <tr>
            <SortableTh direction="asc" onToggle={onToggle}>
              Chemical
            </SortableTh>
          </tr>
        </THead>
        <TBody>
          <Tr>
            <Td>1,2-Dichloroethane</Td>
          </Tr>
        </TBody>
      </Table>,
    );
    expect(screen.getByRole("table", { name: "Containers" })).toBeTruthy();
    expect(screen.getByRole("columnheader", { name: "Chemical" }).getAttribute("aria-sort")).toBe("ascending");
    await userEvent.click(screen.getByRole("button", { name: "Chemical" }));
    expect(onToggle).toHaveBeenCalledOnce();
  });

  it("pages with Previous and Next, each off at its end, and says which rows show", async () => {
    const onPage = vi.fn();
    render(<Pager page={0} pageSize={50} total={120} onPage={onPage} nothing="No containers" />);
    expect(screen.getByText("1–50 of 120")).toBeTruthy();
    expect((screen.getByRole("button", { name: "Previous" }) as HTMLButtonElement).disabled).toBe(true);
    await userEvent.click(screen.getByRole("button", { name: "Next" }));
    expect(onPage).toHaveBeenCalledWith(1);
  });

  it("draws a table's unchanged rows once when its screen draws again, and again when their columns change", async () => {
    interface Bottle { id: number; name: string }
    const drawn: string[] = [];
    const col = createColumnHelper<Bottle>();
    const nameColumn = col.accessor("name", { header: "Chemical", cell: (c) => (drawn.push(c.getValue()), c.getValue()) });
    const data: Bottle[] = [{ id: 1, name: "Dichloromethane" }, { id: 2, name: "Nitrobenzene" }];
    function Screen() {
      const [filter, setFilter] = useState("");
      const [marked, setMarked] = useState(false);
      const columns = useMemo(
        () => [nameColumn, col.display({ id: "mark", header: "Mark", cell: (c) => (marked ? `marked ${c.row.original.id}` : "–") })],
        [marked],
      );
      const table = useReactTable({ data, columns, getCoreRowModel: getCoreRowModel() });
      return (
        <>
          <input aria-label="Filter" value={filter} onChange={(e) => setFilter(e.target.value)} />
          <button type="button" onClick={() => setMarked(true)}>Mark all</button>
          <Table caption="Bottles">
            <TBody>
              <BodyRows table={table} />
            </TBody>
          </Table>
        </>
      );
    }
    render(<Screen />);
    expect(drawn).toEqual(["Dichloromethane", "Nitrobenzene"]);
    // The screen draws again (a key in the filter) with the same rows and columns: no row draws.
    await userEvent.type(screen.getByRole("textbox", { name: "Filter" }), "n");
    expect(drawn).toHaveLength(2);
    // New columns (a column that reads the screen's state) draw every row again, with that state.
    await userEvent.click(screen.getByRole("button", { name: "Mark all" }));
    expect(drawn).toHaveLength(4);
    expect(screen.getByText("marked 2")).toBeTruthy();
  });
});
