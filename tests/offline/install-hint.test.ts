/**
 * What the install hint offers on each kind of browser. The user-agent strings
 * are those the browsers send (from memory of their published formats); what
 * matters is the platform token each one carries.
 */
import { describe, expect, test } from 'vitest';
import { installSentences, installSituation, type BrowserFacts } from '../../src/ui/offline/InstallHint.tsx';

const iphoneSafari = 'Mozilla/5.0 (iPhone; CPU iPhone OS 17_5 like Mac OS X) AppleWebKit/605.1.15 (KHTML, like Gecko) Version/17.5 Mobile/15E148 Safari/604.1';
const ipadSafari = 'Mozilla/5.0 (Macintosh; Intel Mac OS X 10_15_7) AppleWebKit/605.1.15 (KHTML, like Gecko) Version/17.5 Safari/605.1.15';
const androidFirefox = 'Mozilla/5.0 (Android 14; Mobile; rv:128.0) Gecko/128.0 Firefox/128.0';
const androidChrome = 'Mozilla/5.0 (Linux; Android 14; Pixel 8) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/126.0.0.0 Mobile Safari/537.36';

function facts(userAgent: string, change: Partial<BrowserFacts> = {}): BrowserFacts {
  return { userAgent, maxTouchPoints: 0, standalone: false, hasInstallPrompt: false, ...change };
}

describe('installSituation', () => {
  test('a browser with its own install prompt waits for it', () => {
    expect(installSituation(facts(androidChrome, { hasInstallPrompt: true, maxTouchPoints: 5 }))).toBe('wait-for-prompt');
  });

  test('Safari on iPhone, and on iPad (which reports a Mac but has a touch screen), is told to use Share', () => {
    expect(installSituation(facts(iphoneSafari, { maxTouchPoints: 5 }))).toBe('ios-share');
    expect(installSituation(facts(ipadSafari, { maxTouchPoints: 5 }))).toBe('ios-share');
  });

  test('Safari on a Mac without touch is not sent to a Share menu it does not have', () => {
    expect(installSituation(facts(ipadSafari))).toBe('browser-menu');
  });

  test('Firefox is pointed at its menu', () => {
    expect(installSituation(facts(androidFirefox, { maxTouchPoints: 5 }))).toBe('firefox-menu');
  });

  test('an installed app (standalone) gets no hint, whatever the browser', () => {
    expect(installSituation(facts(iphoneSafari, { standalone: true, maxTouchPoints: 5 }))).toBe('installed');
    expect(installSituation(facts(androidChrome, { standalone: true, hasInstallPrompt: true }))).toBe('installed');
  });
});

describe('installSentences', () => {
  test('each is one sentence saying installing protects the data from clean-up, and how', () => {
    for (const sentence of Object.values(installSentences)) {
      expect(sentence).toMatch(/protects your surveys from the browser’s automatic clean-up/);
      expect(sentence.match(/[.!?](\s|$)/g)).toHaveLength(1);
    }
    expect(installSentences['ios-share']).toContain('tap Share, then Add to Home Screen');
  });
});
