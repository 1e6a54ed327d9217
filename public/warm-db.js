// Opens the app's database as soon as the page is parsed — before the app's script has been fetched,
// compiled and run — and closes it once open: on a cold start the browser's opening of the database (read
// from the phone's storage) is the longest wait before the field screen can draw, and started here it
// overlaps the loading of the app, whose own open (web/storage/db.ts) then finds it ready. It changes
// nothing: when the stored version is older, or there is no database yet, the upgrade is aborted (a
// database created by this open is removed again) and the app's own open upgrades as always.
// A plain script (it runs before the app's modules); its name and version are the app's DB_NAME and
// DB_VERSION (web/storage/schema.ts), which test/web/storage-upgrade.test.ts checks.
(() => {
  try {
    const req = indexedDB.open('sure-enough', 4);
    req.onupgradeneeded = () => req.transaction?.abort();
    req.onsuccess = () => req.result.close();
    // the aborted upgrade ends here: not the page's error
    req.onerror = (e) => e.preventDefault();
  } catch {
    /* no IndexedDB here: the app's own open says so */
  }
})();
