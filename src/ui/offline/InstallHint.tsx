/**
 * Suggests installing Lampwalk. Where the browser offers installation
 * (`beforeinstallprompt`), an Install button opens its dialog. Where it does
 * not (Safari on iPhone and iPad, Firefox), one sentence says why installing
 * matters (browsers may clear the saved data of sites, not of installed apps)
 * and how to do it there. Shows nothing once installed or dismissed.
 */
import { useEffect, useState } from 'preact/hooks';
import './offline.css';

/** The event Chromium browsers fire when the app can be installed (not in the DOM typings). */
interface InstallPromptEvent extends Event {
  prompt(): Promise<void>;
  readonly userChoice: Promise<{ outcome: 'accepted' | 'dismissed'; platform: string }>;
}

function isInstallPrompt(event: Event): event is InstallPromptEvent {
  return 'prompt' in event && typeof event.prompt === 'function';
}

/** Where to find "install" in browsers without an install prompt. */
export type InstallRoute = 'ios-share' | 'firefox-menu' | 'browser-menu';

/** What the hint offers on this browser. */
export type InstallSituation = 'installed' | 'wait-for-prompt' | InstallRoute;

/** The facts about the browser the hint depends on (the real ones by default). */
export interface BrowserFacts {
  userAgent: string;
  maxTouchPoints: number;
  /** Running as an installed app (display-mode standalone, or iOS's `navigator.standalone`). */
  standalone: boolean;
  /** The browser has `onbeforeinstallprompt` (Chromium browsers), so it offers installation itself. */
  hasInstallPrompt: boolean;
}

function browserFacts(): BrowserFacts {
  const iosStandalone = (navigator as Navigator & { standalone?: boolean }).standalone === true;
  return {
    userAgent: navigator.userAgent,
    maxTouchPoints: navigator.maxTouchPoints,
    standalone: iosStandalone || window.matchMedia('(display-mode: standalone)').matches,
    hasInstallPrompt: 'onbeforeinstallprompt' in window,
  };
}

/**
 * What to offer, from the browser's facts.
 *
 * @example
 * installSituation({ userAgent: 'Mozilla/5.0 (iPhone; CPU iPhone OS 17_5 like Mac OS X) … Safari/604.1', maxTouchPoints: 5, standalone: false, hasInstallPrompt: false })
 * //=> 'ios-share'
 */
export function installSituation(facts: BrowserFacts): InstallSituation {
  if (facts.standalone) return 'installed';
  if (facts.hasInstallPrompt) return 'wait-for-prompt';
  // iPadOS reports itself as a Mac; a touch screen tells them apart.
  const apple = /iPhone|iPad|iPod/.test(facts.userAgent) || (/Macintosh/.test(facts.userAgent) && facts.maxTouchPoints > 1);
  if (apple) return 'ios-share';
  if (/Firefox\//.test(facts.userAgent)) return 'firefox-menu';
  return 'browser-menu';
}

const why = 'Installing Lampwalk protects your surveys from the browser’s automatic clean-up of website data';

/** The one sentence for browsers without an install prompt. */
export const installSentences: Readonly<Record<InstallRoute, string>> = {
  'ios-share': `${why}: tap Share, then Add to Home Screen.`,
  'firefox-menu': `${why}: open the browser menu, then Install (or Add to Home screen).`,
  'browser-menu': `${why}: use your browser’s menu to install it or add it to the home screen.`,
};

const dismissedKey = 'lampwalk.installHintDismissed';

function wasDismissed(): boolean {
  try {
    return localStorage.getItem(dismissedKey) !== null;
  } catch {
    return false;
  }
}

function rememberDismissal(): void {
  try {
    localStorage.setItem(dismissedKey, new Date().toISOString());
  } catch {
    // Storage refused (private mode): the hint simply shows again next time.
  }
}

export interface InstallHintProps {
  /** For tests: the browser facts to use instead of the real ones. */
  facts?: BrowserFacts;
  /** Quiet time after the app opens before the hint shows (default 3 s: the first screen comes first). */
  delayMs?: number;
}

/**
 * The install suggestion. Mount once; it renders nothing when there is
 * nothing to suggest.
 *
 * @example
 * <InstallHint />
 * //=> an "Install Lampwalk" button in Chromium browsers once installable; a one-sentence how-to on iPhone Safari
 */
export function InstallHint(props: InstallHintProps) {
  const [situation, setSituation] = useState<InstallSituation>(() => installSituation(props.facts ?? browserFacts()));
  const [prompt, setPrompt] = useState<InstallPromptEvent | null>(null);
  const [dismissed, setDismissed] = useState(wasDismissed);
  const [quiet, setQuiet] = useState(true);
  const delayMs = props.delayMs ?? 3000;

  useEffect(() => {
    const timer = window.setTimeout(() => setQuiet(false), delayMs);
    return () => window.clearTimeout(timer);
  }, [delayMs]);

  useEffect(() => {
    const offer = (event: Event) => {
      if (!isInstallPrompt(event)) return;
      event.preventDefault(); // keep the browser's own mini bar away; our button opens the dialog
      setPrompt(event);
    };
    const installed = () => {
      setPrompt(null);
      setSituation('installed');
    };
    window.addEventListener('beforeinstallprompt', offer);
    window.addEventListener('appinstalled', installed);
    return () => {
      window.removeEventListener('beforeinstallprompt', offer);
      window.removeEventListener('appinstalled', installed);
    };
  }, []);

  if (quiet || dismissed || situation === 'installed') return null;
  if (situation === 'wait-for-prompt' && !prompt) return null;

  const dismiss = () => {
    rememberDismissal();
    setDismissed(true);
  };
  const install = async () => {
    if (!prompt) return;
    setPrompt(null); // a prompt event can be used once
    await prompt.prompt();
    const choice = await prompt.userChoice;
    if (choice.outcome === 'accepted') setSituation('installed');
  };

  return (
    <aside class="install-hint" aria-label="Install Lampwalk">
      {situation === 'wait-for-prompt' ? (
        <p>{`${why}, and puts it on your home screen, ready to open with no signal.`}</p>
      ) : (
        <p>{installSentences[situation]}</p>
      )}
      <p class="install-hint__actions">
        {situation === 'wait-for-prompt' && (
          <button type="button" class="offline-status__button" onClick={install}>
            Install Lampwalk
          </button>
        )}
        <button type="button" class="install-hint__dismiss" onClick={dismiss}>
          Not now
        </button>
      </p>
    </aside>
  );
}
