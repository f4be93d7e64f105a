import { useEffect, useRef } from 'react';
import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import { formatSiteTime } from '../../../lib/format';
import { accent, ink, surface } from '../../../theme';
import type { TimelineItem } from '../utils/entry-text';

export interface TimelineListProps {
  items: readonly TimelineItem[];
  /** index of the last item at or before the replay's moment; -1 before the first */
  currentIndex: number;
  timeZone: string;
  onSelect: (siteTimeMs: number) => void;
  height?: number;
}

/**
 * The record as it happened: logbook entries (orders, notices, shift notes, ...) and the system's
 * alarm events. The one at the replay's moment is marked and kept in view; a click jumps there.
 */
export function TimelineList({
  items,
  currentIndex,
  timeZone,
  onSelect,
  height = 420,
}: TimelineListProps) {
  const listRef = useRef<HTMLOListElement>(null);
  const current = items[currentIndex];

  useEffect(() => {
    const list = listRef.current;
    const row = list?.querySelector<HTMLElement>('[data-current="true"]');
    if (!list || !row) return;
    // scroll the list only, never the page
    const top = row.offsetTop - list.offsetTop;
    if (top < list.scrollTop || top > list.scrollTop + list.clientHeight - row.clientHeight)
      list.scrollTop = Math.max(0, top - list.clientHeight / 3);
  }, [currentIndex]);

  if (!items.length)
    return (
      <Typography color="text.secondary">
        No logbook entries or alarm events in this window.
      </Typography>
    );
  return (
    <Box
      component="ol"
      ref={listRef}
      data-testid="replay-entry-list"
      data-current-key={current?.key ?? ''}
      data-passed={currentIndex + 1}
      sx={{ listStyle: 'none', m: 0, p: 0, maxHeight: height, overflowY: 'auto' }}
    >
      {items.map((item, i) => {
        const shown = formatSiteTime(item.siteTimeMs, timeZone);
        const isCurrent = i === currentIndex;
        return (
          <Box
            component="li"
            key={item.key}
            data-current={isCurrent}
            data-testid={`replay-item-${item.key}`}
            data-site-time-ms={item.siteTimeMs}
            sx={{
              borderLeft: `3px solid ${isCurrent ? accent : 'transparent'}`,
              bgcolor: isCurrent ? surface.raised : 'transparent',
              opacity: i > currentIndex ? 0.55 : 1,
            }}
          >
            <Box
              component="button"
              type="button"
              onClick={() => onSelect(item.siteTimeMs)}
              sx={{
                all: 'unset',
                cursor: 'pointer',
                display: 'block',
                width: '100%',
                boxSizing: 'border-box',
                px: 1,
                py: 0.5,
                '&:focus-visible': { outline: `2px solid ${accent}` },
              }}
            >
              <Typography
                component="span"
                sx={{ fontFamily: 'monospace', fontSize: 13, color: ink.secondary }}
              >
                {shown.time}
                {item.estimated ? '≈' : ' '} {item.kind}
                {item.who ? ` · ${item.who}` : ''}
              </Typography>
              {item.text && (
                <Typography component="span" sx={{ display: 'block', fontSize: 14 }}>
                  {item.text}
                </Typography>
              )}
            </Box>
          </Box>
        );
      })}
    </Box>
  );
}
