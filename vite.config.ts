import { readFileSync } from 'node:fs';
import { defineConfig, type Plugin } from 'vite';
import preact from '@preact/preset-vite';
import { VitePWA } from 'vite-plugin-pwa';

const packageVersion = (JSON.parse(readFileSync(new URL('./package.json', import.meta.url), 'utf8')) as { version: string }).version;

/**
 * The build's identity, shown by the offline status and changed between the
 * two builds of the update test: LAMPWALK_BUILD_ID when set, else the package
 * version (so rebuilding the same sources gives the same service worker and
 * users are not asked to update for nothing).
 */
const buildId = process.env.LAMPWALK_BUILD_ID ?? packageVersion;

/**
 * jsPDF loads html2canvas, canvg and dompurify with `import()` for `doc.html()`
 * and SVG images, which Lampwalk never uses. Bundled, they would be emitted as
 * chunks and precached (~370 KB). They resolve instead to one small module
 * that says what is missing if anything ever calls it.
 */
const jspdfOptionalHelpers = ['html2canvas', 'canvg', 'dompurify'];
const unbundledId = '\0lampwalk-unbundled-helper';
function leaveOutJspdfHelpers(): Plugin {
  return {
    name: 'lampwalk:leave-out-jspdf-helpers',
    enforce: 'pre',
    resolveId(id) {
      return jspdfOptionalHelpers.includes(id) ? unbundledId : null;
    },
    load(id) {
      if (id !== unbundledId) return null;
      return `export default function unbundled() { throw new Error('Lampwalk does not bundle this optional jsPDF helper (HTML and SVG drawing are not used).'); }`;
    },
  };
}

/**
 * The Content-Security-Policy, written once in index.html (a meta tag, so it
 * holds wherever the build is hosted). `vite preview` also sends it as a
 * header, with frame-ancestors, which browsers ignore in a meta tag.
 */
const contentSecurityPolicy = (() => {
  const html = readFileSync(new URL('./index.html', import.meta.url), 'utf8');
  const match = /http-equiv="Content-Security-Policy"\s+content="([^"]+)"/.exec(html);
  if (!match?.[1]) throw new Error('index.html holds no Content-Security-Policy meta tag');
  return match[1];
})();

/**
 * The development server injects its own client and hot-reload helpers, some
 * inline; the policy applies to the build (and `vite preview`) only.
 */
function policyInBuildOnly(): Plugin {
  return {
    name: 'lampwalk:policy-in-build-only',
    apply: 'serve',
    transformIndexHtml(html) {
      return html.replace(/\s*<meta\s+http-equiv="Content-Security-Policy"[^>]*>/, '');
    },
  };
}

export default defineConfig({
  define: {
    __LAMPWALK_BUILD__: JSON.stringify(buildId),
  },
  plugins: [
    leaveOutJspdfHelpers(),
    policyInBuildOnly(),
    preact(),
    VitePWA({
      // generateSW: the worker only precaches and serves the app shell, which
      // Workbox's generated worker does with no code of ours to keep typed and
      // tested in a second runtime. Registration is ours (src/ui/offline).
      strategies: 'generateSW',
      registerType: 'prompt',
      injectRegister: false,
      // The plugin writes manifest.webmanifest, links it from index.html and
      // precaches it itself (so globPatterns below leave it out).
      manifest: {
        name: 'Lampwalk',
        short_name: 'Lampwalk',
        description: 'Room-by-room LED retrofit surveys: savings, light levels, electrical load and safety warnings, with no signal needed.',
        lang: 'en',
        start_url: '.',
        scope: '.',
        display: 'standalone',
        orientation: 'any',
        theme_color: '#1d3b34',
        background_color: '#f7f5ef',
        categories: ['productivity', 'utilities'],
        icons: [
          { src: 'icons/icon-192.png', sizes: '192x192', type: 'image/png', purpose: 'any' },
          { src: 'icons/icon-512.png', sizes: '512x512', type: 'image/png', purpose: 'any' },
          { src: 'icons/maskable-192.png', sizes: '192x192', type: 'image/png', purpose: 'maskable' },
          { src: 'icons/maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
        ],
      },
      // What the page shows (favicon, apple-touch icon) and the 192 px icon
      // Chromium fetches on every visit to check installability (precached, it
      // comes from the worker with no signal instead of failing). The larger
      // install-time icons are fetched by the browser when it installs.
      includeManifestIcons: false,
      includeAssets: ['icons/icon.svg', 'icons/apple-touch-icon.png', 'icons/icon-192.png'],
      workbox: {
        // Every script (the lazily loaded export code included), style, page,
        // image and font the build emits; never sourcemaps.
        globPatterns: ['**/*.{js,css,html,woff2}'],
        globIgnores: ['**/*.map', 'sw.js', 'workbox-*.js'],
        navigateFallback: 'index.html',
        cleanupOutdatedCaches: true,
        // The first worker takes the page at once (so it is ready offline
        // without a reload); later versions wait for the user (prompt).
        clientsClaim: true,
        skipWaiting: false,
        sourcemap: false,
      },
    }),
  ],
  build: {
    target: 'es2022',
    sourcemap: true,
  },
  preview: {
    host: '127.0.0.1',
    headers: { 'Content-Security-Policy': `${contentSecurityPolicy}; frame-ancestors 'none'` },
  },
});
