// The floor pages' database: one store shaped like the app's log (keyPath id, unique [studyId, seq]).
const FLOOR_STUDY = 'floor-study';
function floorOpen() {
  return new Promise((resolve, reject) => {
    const req = indexedDB.open('floor', 1);
    req.onupgradeneeded = () => {
      const obs = req.result.createObjectStore('observations', { keyPath: 'id' });
      obs.createIndex('byStudySeq', ['studyId', 'seq'], { unique: true });
    };
    req.onsuccess = () => resolve(req.result);
    req.onerror = () => reject(req.error);
  });
}
// biome-ignore lint/correctness/noUnusedVariables: a global of the floor pages and the bench
function floorCount(db) {
  return new Promise((resolve) => {
    const req = db.transaction('observations').objectStore('observations').count();
    req.onsuccess = () => resolve(req.result);
  });
}
function floorRecord(seq, studyId = FLOOR_STUDY) {
  return {
    id: crypto.randomUUID(),
    studyId,
    seq,
    at: new Date().toISOString().replace('Z', '+00:00'),
    device: 'bench-device',
    value: 18 + (seq % 7) * 0.5,
  };
}
/** Seeds `n` records of the study `floor-study-<n>` in one transaction (read.html#<n> reads them). */
// biome-ignore lint/correctness/noUnusedVariables: a global of the floor pages and the bench
function floorSeed(n) {
  return floorOpen().then(
    (db) =>
      new Promise((resolve, reject) => {
        const tx = db.transaction('observations', 'readwrite');
        for (let i = 1; i <= n; i++)
          tx.objectStore('observations').add(floorRecord(i, `${FLOOR_STUDY}-${n}`));
        tx.oncomplete = () => {
          db.close();
          resolve(n);
        };
        tx.onerror = () => reject(tx.error);
      }),
  );
}
