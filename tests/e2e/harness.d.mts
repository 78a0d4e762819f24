// Types of the end-to-end harness (harness.mjs), for TypeScript callers such as scripts/bench/browser.ts.
import type { Browser, BrowserContext, Page } from 'playwright-core';

/** Repository root. */
export const ROOT: string;
/** Screenshot folder (git-ignored). */
export const ARTIFACTS: string;
/** Debian's Chromium. */
export const CHROMIUM: string;
/** Seeded demo accounts by role. */
export const ACCOUNTS: Record<'engineer' | 'reviewer' | 'tester' | 'admin', string>;
/** Seeded demo password. */
export const DEMO_PASSWORD: string;

/** Keystroke-to-plots timing. */
export interface KeystrokeTiming {
  samplesMs: number[];
  missed: number;
  medianMs: number | null;
  p95Ms: number | null;
  minMs: number | null;
  maxMs: number | null;
  analysisMedianMs: number | null;
}

/** Builds the client when dist/ is older than its sources; returns whether it built. */
export function buildClientIfNeeded(log?: (line: string) => void): boolean;
/** A free port on 127.0.0.1. */
export function freePort(): Promise<number>;
/** Starts the real server with a fresh temporary database. */
export function startServer(log?: (line: string) => void): Promise<{ origin: string; stop: () => Promise<void>; output: string[] }>;
/** Launches Debian's Chromium headless. */
export function launchBrowser(): Promise<Browser>;
/** Stamps every 2D-canvas draw call of the context's pages. */
export function instrumentCanvas(context: BrowserContext): Promise<void>;
/** Reports console errors, uncaught exceptions and 5xx answers of a page. */
export function watchPage(page: Page, sink: (message: string) => void): void;
/** The real input of a Quasar field by data-test. */
export function field(page: Page, test: string, tag?: 'input' | 'textarea'): ReturnType<Page['locator']>;
/** Signs in through the form. */
export function signIn(page: Page, origin: string, role: 'engineer' | 'reviewer' | 'tester' | 'admin'): Promise<void>;
/** Share of drawn canvas pixels. */
export function canvasInk(page: Page): Promise<{ canvases: number; inkFraction: number }>;
/** Times keystroke -> redrawn plots. */
export function measureKeystrokeToPlots(page: Page, selector: string, rounds?: number): Promise<KeystrokeTiming>;
/** Creates a design through the New design dialog; returns its id. */
export function createDesign(page: Page, origin: string, name: string): Promise<number>;
/** Opens the Loop shapes tab and waits for ink on its canvases. */
export function showPlots(page: Page): Promise<{ canvases: number; inkFraction: number }>;
/** Creates a design as the engineer and waits for drawn plots. */
export function createDesignAndShowPlots(page: Page, origin: string, name: string): Promise<{ id: number; ink: { canvases: number; inkFraction: number } }>;
