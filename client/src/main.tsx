import { StrictMode } from "react";
import { createRoot } from "react-dom/client";
// The weights the type scale uses; the files ship inside the build.
import "@fontsource/ibm-plex-sans/400.css";
import "@fontsource/ibm-plex-sans/500.css";
import "@fontsource/ibm-plex-sans/600.css";
import "./index.css";
// Our own validation wording for every zod parse in the browser (installs a global zod error map).
import "@shared/validation-messages";
import { AppProvider } from "./app/provider";
import { AppRouter } from "./app/router";

const root = document.getElementById("root");
if (!root) throw new Error("index.html has no #root element");

createRoot(root).render(
  <StrictMode>
    <AppProvider>
      <AppRouter />
    </AppProvider>
  </StrictMode>,
);
