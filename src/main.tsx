/** Phasebook's client entry: mount the providers and the router into #root. */
import { StrictMode } from "react";
import { createRoot } from "react-dom/client";
import { AppProvider } from "./app/provider";
import { AppRouter } from "./app/router";
import "./styles/index.css";

const root = document.getElementById("root");
if (!root) throw new Error("index.html has no #root element");

createRoot(root).render(
  <StrictMode>
    <AppProvider>
      <AppRouter />
    </AppProvider>
  </StrictMode>,
);
