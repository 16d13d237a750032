/// <reference lib="webworker" />
/** The engine in a Web Worker: the page stays responsive while iterations run. */
import * as Comlink from "comlink";
import { createEngineApi } from "./engine-api";

Comlink.expose(createEngineApi());
