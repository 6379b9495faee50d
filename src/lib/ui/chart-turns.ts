/**
 * Drawings made one per task — charts, and the quarterly review's sections after its headline: a page with
 * several charts (the quarterly review has five) created them all in one task, which on a slow machine held the
 * page for over half a second. Each drawing waits for the one before and then for a fresh task, so the browser
 * can paint and answer input in between.
 */
let queue: Promise<void> = Promise.resolve();

export function inTurn(draw: () => void): Promise<void> {
  const turn = queue.then(
    () =>
      new Promise<void>((resolve, reject) =>
        setTimeout(() => {
          try {
            draw();
            resolve();
          } catch (error) {
            reject(error instanceof Error ? error : new Error(String(error)));
          }
        }, 0)
      )
  );
  queue = turn.catch(() => undefined);
  return turn;
}
