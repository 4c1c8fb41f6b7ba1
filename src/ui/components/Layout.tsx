/**
 * The frame of every screen: the top bar (name, surveys, catalog, settings),
 * a way back, and the screen's heading, which takes the focus when the
 * screen opens so keyboard and screen-reader users start at the top.
 */
import type { ComponentChildren } from 'preact';
import { useEffect, useRef } from 'preact/hooks';
import { href, type Route } from '../router.ts';
import { Icon } from './Icon.tsx';

function Logo() {
  return (
    <svg class="logo" width="36" height="36" viewBox="0 0 36 36" aria-hidden="true" focusable="false">
      <rect x="1" y="1" width="34" height="34" rx="9" class="logo-tile" />
      <path d="M18 5v5" class="logo-cord" />
      <path d="M11 10h14l4 9H7z" class="logo-shade" />
      <path d="M14 19a4 4 0 0 0 8 0" class="logo-bulb" />
      <path d="M9 26l-2 2M27 26l2 2M18 26.5V31" class="logo-rays" />
    </svg>
  );
}

type Section = 'surveys' | 'portfolios' | 'catalog' | 'settings';

/**
 * The bar at the top of every screen: the name, surveys, catalog and settings.
 *
 * @example <TopBar current="catalog" /> //=> the bar with Catalog marked as the current page
 */
export function TopBar(props: { current: Section }) {
  const link = (section: Section, route: Route, label: string, icon: 'list' | 'copy' | 'box' | 'gear') => (
    <a class="topnav-link" href={href(route)} aria-current={props.current === section ? 'page' : undefined}>
      <Icon name={icon} size={22} />
      <span>{label}</span>
    </a>
  );
  return (
    <header class="topbar">
      <a class="skip-link" href="#main">
        Skip to content
      </a>
      <a class="brand" href={href({ name: 'surveys' })}>
        <Logo />
        <span class="brand-name">Lampwalk</span>
      </a>
      <nav class="topnav" aria-label="Main">
        {link('surveys', { name: 'surveys' }, 'Surveys', 'list')}
        {link('portfolios', { name: 'portfolios' }, 'Portfolios', 'copy')}
        {link('catalog', { name: 'catalog' }, 'Catalog', 'box')}
        {link('settings', { name: 'settings' }, 'Settings', 'gear')}
      </nav>
    </header>
  );
}

interface ScreenProps {
  title: string;
  /** Where "back" goes, with its words ("Shop floor"). */
  back?: { route: Route; label: string };
  section: Section;
  /** Shown under the heading (site, space type…). */
  subtitle?: ComponentChildren;
  /** Beside the heading (save status). */
  aside?: ComponentChildren;
  children: ComponentChildren;
  class?: string;
}

/**
 * The frame of a screen: top bar, back link and the heading that takes the focus.
 *
 * @example <Screen title="Surveys" section="surveys">…</Screen> //=> the screen with its h1 focused
 */
export function Screen(props: ScreenProps) {
  const heading = useRef<HTMLHeadingElement>(null);
  useEffect(() => {
    heading.current?.focus({ preventScroll: true });
    window.scrollTo(0, 0);
  }, [props.title === '' ? null : location.hash]);
  useEffect(() => {
    document.title = props.title ? `${props.title} · Lampwalk` : 'Lampwalk';
  }, [props.title]);
  return (
    <>
      <TopBar current={props.section} />
      <main id="main" class={`screen ${props.class ?? ''}`}>
        <div class="screen-head">
          {props.back && (
            <a class="back-link" href={href(props.back.route)}>
              <Icon name="back" size={20} />
              <span>{props.back.label}</span>
            </a>
          )}
          <div class="screen-title">
            <h1 ref={heading} tabIndex={-1}>
              {props.title}
            </h1>
            {props.aside}
          </div>
          {props.subtitle && <div class="screen-subtitle">{props.subtitle}</div>}
        </div>
        {props.children}
      </main>
    </>
  );
}
