import { afterEach } from "vitest";
import { cleanup, configure } from "@testing-library/react";

afterEach(() => cleanup());

// The map editor's panels (inspector, table, follow-up list) follow the map a frame later, and
// the shared test machine can be busy: findBy…/waitFor wait up to 5 s (the default is 1 s).
// A wait that succeeds returns as soon as the element is there; only a failing test is slower.
configure({ asyncUtilTimeout: 5_000 });
