/**
 * The forms with rules — booking, usage, solution — against the real server of global-setup.ts
 * (the demo facility, the API tests' fixed clock 2026-12-02 15:00 UTC): the rules show in words
 * beside their fields as the person types, the server's refusals land on the right field, and a
 * good entry goes through.
 */
import { beforeAll, describe, expect, it, vi } from "vitest";
import { fireEvent, screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { DateTime } from "luxon";
import type { InstrumentDto } from "@shared/schemas/instruments";
import type { ContainerDto } from "@shared/schemas/stock";
import { BookingForm } from "@/features/schedule/components/booking-form";
import { ContainerActions } from "@/features/stockroom/components/container-actions";
import { PrepareSolutionForm } from "@/features/stockroom/components/prepare-solution-form";
import { FACILITY_TZ, get, renderScreen, signInAs } from "./support";

const MEMBER = "member@kestrelbay.example";
const field = (label: RegExp | string) => screen.getByLabelText(label) as HTMLInputElement;
const errorOf = (input: HTMLElement) =>
  (input.getAttribute("aria-describedby") ?? "")
    .split(" ")
    .map((id) => document.getElementById(id)?.textContent ?? "")
    .join(" ");

describe("the booking form", () => {
  let instruments: InstrumentDto[];
  let trained: InstrumentDto;
  let untrained: InstrumentDto;
  // Wednesday two weeks after the fixed clock, 10:00–11:30 on the facility's clock.
  const start = DateTime.fromISO("2026-12-16T10:00", { zone: FACILITY_TZ });

  beforeAll(async () => {
    const me = await signInAs(MEMBER);
    instruments = (await get<{ items: InstrumentDto[] }>("/instruments?limit=200")).items;
    const records = (await get<{ items: { instrumentId: number; state: string }[] }>(`/training?userId=${me.id}`)).items;
    const current = new Set(records.filter((r) => r.state === "current" || r.state === "expiring").map((r) => r.instrumentId));
    const bookable = instruments.filter((i) => i.status === "in_service" && !i.requiresApproval && i.kind === "potentiostat");
    const window = `from=${encodeURIComponent(start.startOf("day").toISO()!)}&to=${encodeURIComponent(start.endOf("day").toISO()!)}`;
    for (const i of bookable.filter((x) => current.has(x.id))) {
      if ((await get<{ total: number }>(`/bookings?instrumentId=${i.id}&${window}`)).total === 0) {
        trained = i;
        break;
      }
    }
    untrained = instruments.find((i) => i.status === "in_service" && i.trainingRequired && !current.has(i.id))!;
    expect(trained, "a free potentiostat the member is trained on").toBeDefined();
    expect(untrained, "an instrument the member is not trained on").toBeDefined();
  });

  const renderForm = (onDone = vi.fn()) => {
    renderScreen(<BookingForm start={start.toJSDate()} end={start.plus({ minutes: 90 }).toJSDate()} instruments={instruments} zone={FACILITY_TZ} preselected={[]} onDone={onDone} onCancel={() => undefined} />);
    return onDone;
  };

  it("asks for an instrument before anything is sent", async () => {
    const onDone = renderForm();
    await userEvent.click(screen.getByRole("button", { name: "Book" }));
    const group = await screen.findByRole("group", { name: /Instruments/ });
    await vi.waitFor(() => expect(errorOf(group)).toContain("Choose at least one instrument"));
    expect(onDone).not.toHaveBeenCalled();
  });

  it("says beside the field that a time in the hour the clocks skip does not exist", async () => {
    renderForm();
    // Clocks go forward at 02:00 on Sunday 14 March 2027 in Halifax (the second Sunday of March; from memory, US/Canada rule).
    fireEvent.change(screen.getByLabelText(/^Start/), { target: { value: "2027-03-14T02:30" } });
    const startField = screen.getByLabelText(/^Start/);
    expect(startField.getAttribute("aria-invalid")).toBe("true");
    expect(errorOf(startField)).toMatch(/14 March 2027/);
  });

  it("puts the server's refusal in words when the member is not trained on the instrument", async () => {
    const onDone = renderForm();
    await userEvent.click(screen.getByRole("checkbox", { name: untrained.name }));
    await userEvent.click(screen.getByRole("button", { name: "Book" }));
    const alert = await screen.findByRole("alert", {}, { timeout: 10_000 });
    expect(alert.textContent).toMatch(/train/i);
    expect(onDone).not.toHaveBeenCalled();
  });

  it("books a free slot on an instrument the member is trained on", async () => {
    const onDone = renderForm();
    await screen.findAllByRole("option", { name: / – / }, { timeout: 10_000 }); // the accounts arrived
    await userEvent.click(screen.getByRole("checkbox", { name: trained.name }));
    await userEvent.type(field("Purpose"), "Ferrocene CV in DCE");
    await userEvent.click(screen.getByRole("button", { name: "Book" }));
    await vi.waitFor(() => expect(onDone).toHaveBeenCalledWith("Booked: confirmed."), { timeout: 10_000 });
  });
});

describe("the usage form", () => {
  let bottle: ContainerDto;

  beforeAll(async () => {
    await signInAs(MEMBER);
    const list = (await get<{ items: ContainerDto[] }>("/containers?limit=100&status=sealed,in_use")).items;
    bottle = list.find((c) => c.abilities.draw && c.quantity > 5 && c.kind !== "waste")!;
    expect(bottle, "a container the member may draw from").toBeDefined();
  });

  it("explains a bad amount beside the field as it is typed", async () => {
    renderScreen(<ContainerActions container={bottle} />);
    const amount = await screen.findByLabelText("Amount used", {}, { timeout: 10_000 });
    await userEvent.type(amount, "abc");
    await vi.waitFor(() => expect(errorOf(amount)).toBe("Enter the amount as a number"));
    await userEvent.clear(amount);
    await userEvent.type(amount, "0");
    await vi.waitFor(() => expect(errorOf(amount)).toBe("Enter an amount above zero"));
  });

  it("puts the server's 'not enough left' on the amount, then logs an amount that is there", async () => {
    renderScreen(<ContainerActions container={bottle} />);
    const amount = await screen.findByLabelText("Amount used", {}, { timeout: 10_000 });
    await userEvent.selectOptions(screen.getByLabelText("Unit"), bottle.unit);
    await userEvent.type(amount, String(bottle.quantity * 10));
    await userEvent.click(screen.getByRole("button", { name: "Log usage" }));
    await vi.waitFor(() => expect(errorOf(amount)).toMatch(new RegExp(`Container ${bottle.id} has .* left`)), { timeout: 10_000 });
    expect(amount.getAttribute("aria-invalid")).toBe("true");

    await userEvent.clear(amount);
    await userEvent.type(amount, "1");
    await userEvent.click(screen.getByRole("button", { name: "Log usage" }));
    const done = await screen.findByText(new RegExp(`Logged 1 ${bottle.unit}`), {}, { timeout: 10_000 });
    expect(done.closest('[role="status"]')).not.toBeNull();
  });
});

describe("the solution form", () => {
  beforeAll(async () => {
    await signInAs(MEMBER);
  });

  it("refuses the same container as solute and solvent, a zero concentration and a purity above 100 %", async () => {
    renderScreen(<PrepareSolutionForm />);
    const solute = (await screen.findByLabelText(/Solute container/)) as HTMLSelectElement;
    await vi.waitFor(() => expect(solute.options.length).toBeGreaterThan(2), { timeout: 10_000 });
    const solvent = screen.getByLabelText(/Solvent container/) as HTMLSelectElement;
    const shared = [...solvent.options].find((o) => o.value && [...solute.options].some((s) => s.value === o.value))!;
    await userEvent.selectOptions(solute, shared.value);
    await userEvent.selectOptions(solvent, shared.value);
    await vi.waitFor(() => expect(errorOf(solvent)).toBe("Choose a different container for the solvent"));

    const concentration = field(/Concentration \(mmol\/L\)/);
    await userEvent.clear(concentration);
    await userEvent.type(concentration, "0");
    await vi.waitFor(() => expect(errorOf(concentration)).toBe("The concentration must be above zero"));
    const purity = field(/Purity/);
    await userEvent.clear(purity);
    await userEvent.type(purity, "150");
    await vi.waitFor(() => expect(errorOf(purity)).toBe("The purity is at most 100 %"));
  });

  it("shows the mass to weigh: amount concentration × volume × molar mass, corrected for purity", async () => {
    renderScreen(<PrepareSolutionForm />);
    const solute = (await screen.findByLabelText(/Solute container/)) as HTMLSelectElement;
    await vi.waitFor(() => expect(solute.options.length).toBeGreaterThan(2), { timeout: 10_000 });
    const salt = [...solute.options].find((o) => /chloride/i.test(o.text)) ?? solute.options[1]!;
    await userEvent.selectOptions(solute, salt.value);
    const purity = field(/Purity/);
    await userEvent.clear(purity);
    await userEvent.type(purity, "98");
    const plan = await screen.findByTestId("plan", {}, { timeout: 10_000 });
    await vi.waitFor(() => expect(within(plan).getByText(/corrected for 98 % purity/)).toBeTruthy());
    // m = c·V·M / purity (IUPAC Gold Book, "amount concentration"): 10 mmol/L × 0.100 L × M / 0.98.
    const molarMass = Number(/at ([\d.]+) g\/mol/.exec(plan.textContent ?? "")![1]);
    const shownMg = Number(within(plan).getByTestId("plan-mass").textContent!.replace(" mg", ""));
    expect(shownMg).toBeCloseTo((0.01 * 0.1 * molarMass * 1000) / 0.98, molarMass > 100 ? 0 : 1);
  });
});
