/**
 * Renders its children once the placeholder scrolls into view (IntersectionObserver), so charts
 * below the fold cost nothing when the planner flips from item to item. Where the observer does
 * not exist (tests without layout), children render at once.
 */
import { type ReactNode, useEffect, useRef, useState } from 'react';

export function WhenVisible({ children, minHeight }: { children: ReactNode; minHeight: number }) {
  const ref = useRef<HTMLDivElement>(null);
  const [seen, setSeen] = useState(() => typeof IntersectionObserver === 'undefined');
  useEffect(() => {
    if (seen || !ref.current) return;
    const io = new IntersectionObserver((entries) => {
      if (entries.some((e) => e.isIntersecting)) {
        setSeen(true);
        io.disconnect();
      }
    });
    io.observe(ref.current);
    return () => io.disconnect();
  }, [seen]);
  return seen ? children : <div ref={ref} style={{ minHeight }} />;
}
