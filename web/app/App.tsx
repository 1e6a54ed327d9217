/**
 * The app shell: banners that concern every screen, and the router. The studies list and the field screen
 * are in the shell; the other screens are chunks of their own, loaded when first opened, so that a cold
 * start compiles and runs only what its first screen draws.
 */
import type { ComponentType, VNode } from 'preact';
import { useEffect, useState } from 'preact/hooks';
import { dbBlocked, halfTyped, offlineReady, updateWaiting } from '../state/app-state.ts';
import { useStore } from '../state/store.ts';
import { useRoute } from './router.ts';
import { FieldScreen } from './screens/field.tsx';
import { StudiesScreen } from './screens/studies.tsx';

/** A screen loaded on first use; an empty screen is drawn meanwhile (a moment, from the phone's cache). */
function lazyScreen<P extends object>(load: () => Promise<ComponentType<P>>): ComponentType<P> {
  let Loaded: ComponentType<P> | null = null;
  let loading: Promise<unknown> | null = null;
  return function LazyScreen(props: P) {
    const [failed, setFailed] = useState<string | null>(null);
    const [, loadedNow] = useState(0);
    useEffect(() => {
      if (Loaded) return;
      let live = true;
      loading ??= load().then((c) => {
        Loaded = c;
      });
      loading.then(
        () => live && loadedNow((x) => x + 1),
        (err: Error) => {
          loading = null;
          if (live) setFailed(err.message);
        },
      );
      return () => {
        live = false;
      };
    }, []);
    if (Loaded) return <Loaded {...props} />;
    return (
      <div class="screen" aria-busy={failed === null}>
        {failed !== null && (
          <p class="warn" role="alert">
            This screen could not be loaded ({failed}). Reload the app.
          </p>
        )}
      </div>
    );
  };
}

const NewStudyScreen = lazyScreen(() => import('./screens/new-study.tsx').then((m) => m.NewStudyScreen));
const DemoScreen = lazyScreen(() => import('./screens/studies-demo.tsx').then((m) => m.DemoScreen));
const LogScreen = lazyScreen(() => import('./screens/log.tsx').then((m) => m.LogScreen));
const ReportScreen = lazyScreen(() => import('./screens/report.tsx').then((m) => m.ReportScreen));

export function Banners() {
  const blocked = useStore(dbBlocked);
  const accept = useStore(updateWaiting);
  const typing = useStore(halfTyped);
  const ready = useStore(offlineReady);
  // The "ready offline" note stays until the user taps OK: vanishing by itself would move every control up
  // under a gloved thumb mid-tap.
  return (
    <div class="banners">
      {blocked && (
        <div class="banner warn" role="alert">
          <p>Sure Enough was updated in another tab. Reload this page to keep saving.</p>
          <button type="button" class="btn" onClick={() => window.location.reload()}>
            Reload
          </button>
        </div>
      )}
      {accept && !typing && (
        <div class="banner" role="status" data-testid="update">
          <p>A new version is ready. Your entries are saved.</p>
          <button type="button" class="btn primary" onClick={accept}>
            Update
          </button>
        </div>
      )}
      {ready && (
        <div class="banner ok" role="status">
          <p>Ready to work offline.</p>
          <button type="button" class="btn" onClick={() => offlineReady.set(false)}>
            OK
          </button>
        </div>
      )}
    </div>
  );
}

export function App() {
  const route = useRoute();
  useEffect(() => {
    document.getElementById('main')?.focus();
    window.scrollTo(0, 0);
  }, [route.screen, 'id' in route ? route.id : '']);
  let screen: VNode;
  switch (route.screen) {
    case 'studies':
      screen = <StudiesScreen archived={route.archived} />;
      break;
    case 'new':
      screen = <NewStudyScreen key={`${route.from}-${route.mode}`} {...route} />;
      break;
    case 'demo':
      screen = <DemoScreen />;
      break;
    case 'field':
      screen = <FieldScreen key={route.id} id={route.id} />;
      break;
    case 'log':
      screen = <LogScreen key={route.id} id={route.id} />;
      break;
    case 'report':
      screen = <ReportScreen key={route.id} id={route.id} />;
      break;
    default:
      screen = (
        <div class="screen">
          <h1>Not found</h1>
          <p>
            Nothing lives at “{route.path}”. <a href="#/">Back to the studies</a>
          </p>
        </div>
      );
  }
  return (
    <>
      <Banners />
      <main id="main" tabIndex={-1}>
        {screen}
      </main>
    </>
  );
}
