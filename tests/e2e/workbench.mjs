// Small, bounded helpers that drive the VS Code workbench UI the way a person would: keyboard,
// Quick Open, the Command Palette, hovering text, reading what is on screen.
import { sleep } from './host.mjs';

const SHORT = 15_000;

export async function waitForWorkbench(page) {
    await page.waitForSelector('.monaco-workbench', { timeout: 90_000 });
    await page.waitForSelector('.part.statusbar', { timeout: 60_000 });
}

/** Answers the workspace-trust dialog; returns true when a dialog was there. */
export async function answerTrust(page, trust) {
    const label = trust ? 'Yes, I trust the authors' : "No, I don't trust the authors";
    const button = page.locator('.monaco-dialog-box .monaco-button', { hasText: label });
    try {
        await button.first().waitFor({ state: 'visible', timeout: 30_000 });
    } catch {
        return false;
    }
    await button.first().click();
    await page.locator('.monaco-dialog-box').first().waitFor({ state: 'detached', timeout: SHORT }).catch(() => {});
    return true;
}

async function quickInput(page) {
    const input = page.locator('.quick-input-widget .quick-input-box input');
    await input.first().waitFor({ state: 'visible', timeout: SHORT });
    return input.first();
}

export async function openFile(page, relativePath) {
    // F1 opens the quick input with '>'; replacing the text switches it to file search (Quick Open).
    await page.keyboard.press('F1');
    const input = await quickInput(page);
    await input.fill(relativePath);
    await page.locator('.quick-input-widget .monaco-list-row').first().waitFor({ state: 'visible', timeout: SHORT });
    await sleep(400);
    await page.keyboard.press('Enter');
    const name = relativePath.split('/').pop();
    await page.locator('.tabs-container .tab.active', { hasText: name }).first().waitFor({ timeout: SHORT });
    await page.locator('.editor-instance .view-lines').first().waitFor({ timeout: SHORT });
}

/** Runs a command by its palette title, e.g. "Detent: Show State Diagram". */
export async function runCommand(page, title) {
    await page.keyboard.press('F1');
    const input = await quickInput(page);
    await input.fill(`>${title}`);
    const row = page.locator('.quick-input-widget .monaco-list-row', { hasText: title });
    await row.first().waitFor({ state: 'visible', timeout: SHORT });
    await sleep(300);
    await row.first().click();
}

/** Picks the row of an open Quick Pick whose label is exactly `label` (or accepts a multi-pick with Enter). */
export async function pickQuick(page, label) {
    await quickInput(page);
    if (label === undefined) {
        await sleep(300);
        await page.keyboard.press('Enter');
        return;
    }
    const rows = page.locator('.quick-input-widget .monaco-list-row');
    await rows.first().waitFor({ state: 'visible', timeout: SHORT });
    const n = await rows.count();
    for (let i = 0; i < n; i++) {
        const text = (await rows.nth(i).locator('.label-name').first().innerText().catch(() => '')).trim();
        if (text === label) {
            await rows.nth(i).click();
            return;
        }
    }
    throw new Error(`no Quick Pick row labelled ${label}`);
}

/** Errors and warnings from the status bar's problems item (what the person sees: "⊗ 1 ⚠ 2"). */
export async function problemCounts(page) {
    const item = page.locator('[id="status.problems"]').first();
    await item.waitFor({ timeout: SHORT });
    const aria = (await item.getAttribute('aria-label')) ?? (await item.innerText());
    // VS Code 1.100 writes "Errors: 1, Warnings: 2" (and leaves out a zero count).
    const num = (word) => {
        const m = new RegExp(`${word}s?:\\s*(\\d+)|(\\d+)\\s+${word}s?`, 'i').exec(aria);
        return m ? Number(m[1] ?? m[2]) : 0;
    };
    return { errors: num('Error'), warnings: num('Warning'), text: aria };
}

export async function waitFor(check, ms, what) {
    const until = Date.now() + ms;
    let last;
    while (Date.now() < until) {
        try {
            const v = await check();
            if (v) return v;
        } catch (e) {
            last = e;
        }
        await sleep(250);
    }
    throw new Error(`timed out after ${ms} ms waiting for ${what}${last ? ` (${last.message ?? last})` : ''}`);
}

/** The token span showing `word` on the first line that contains `lineText`. */
export function tokenOnLine(page, lineText, word) {
    return page.locator('.editor-instance .view-line', { hasText: lineText }).first().locator('span > span', { hasText: new RegExp(`^${word}$`) }).first();
}

export async function hoverText(page, lineText, word) {
    const token = tokenOnLine(page, lineText, word);
    await token.waitFor({ timeout: SHORT });
    const box = await token.boundingBox();
    if (!box) throw new Error(`token ${word} not visible`);
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await sleep(150);
    await page.mouse.move(box.x + box.width / 2 + 1, box.y + box.height / 2);
    const hover = page.locator('.monaco-hover:not(.hidden) .monaco-hover-content, .monaco-hover:not(.hidden) .hover-contents');
    await hover.first().waitFor({ state: 'visible', timeout: SHORT });
    return hover.first().innerText();
}

export async function codeLensTitles(page) {
    return page.locator('.editor-instance .codelens-decoration').allInnerTexts();
}

export async function notifications(page) {
    return page.locator('.notifications-toasts .notification-list-item-message, .notifications-center .notification-list-item-message').allInnerTexts();
}

/** The frame (nested in the webview iframes) whose document holds `selector`. */
export async function webviewFrame(page, selector, ms) {
    return waitFor(async () => {
        for (const f of page.frames()) {
            const el = await f.$(selector).catch(() => null);
            if (el) return f;
        }
        return undefined;
    }, ms, `a webview holding ${selector}`);
}

export async function dismissNotifications(page) {
    await runCommand(page, 'Notifications: Clear All Notifications').catch(() => {});
    await sleep(200);
}

/** Replaces the user settings through the Settings (JSON) editor, as a person would, saves and closes it. */
export async function setUserSettings(page, settings) {
    await runCommand(page, 'Preferences: Open User Settings (JSON)');
    await page.locator('.tabs-container .tab.active', { hasText: 'settings.json' }).first().waitFor({ timeout: SHORT });
    await page.locator('.editor-group-container.active .editor-instance .view-lines').first().click();
    await page.keyboard.press('Control+A');
    await page.keyboard.insertText(JSON.stringify(settings, null, 2));
    await page.keyboard.press('Control+S');
    await page.locator('.tabs-container .tab.active.dirty', { hasText: 'settings.json' }).first().waitFor({ state: 'detached', timeout: SHORT }).catch(() => {});
    await runCommand(page, 'View: Close Editor');
}
