/**
 * How far beyond the view a box counts as near it, as a share of the view's height above and below: a chart a
 * reader scrolls towards is drawn before it comes into sight.
 */
export const REACH_OF_VIEW = 0.5;
const REACH = `${REACH_OF_VIEW * 100}% 0px`;

/**
 * Tells `onChange` whether `element` is in the view or near it (REACH), now and whenever that changes; returns
 * the function that stops watching. Without IntersectionObserver every element counts as near.
 *
 * Why: a page's charts were each drawn as the page opened, wherever they were — at company size the quarterly
 * review's six charts were six main-thread tasks of 80–210 ms (CPU throttled 4×) while the reader looked at the
 * headline, and six again for each quarter chosen.
 */
export function watchNearView(element: Element, onChange: (near: boolean) => void): () => void {
  if (typeof IntersectionObserver === 'undefined') {
    onChange(true);
    return () => undefined;
  }
  const observer = new IntersectionObserver(
    (entries) => {
      const latest = entries[entries.length - 1];
      if (latest) onChange(latest.isIntersecting);
    },
    { rootMargin: REACH }
  );
  observer.observe(element);
  return () => observer.disconnect();
}
