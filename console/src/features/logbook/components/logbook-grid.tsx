import Box from '@mui/material/Box';
import { DataGrid, type GridColDef, type GridSortModel } from '@mui/x-data-grid';
import type { LogbookEntry } from '@stillwell/shared/logbook';
import { formatSiteTime } from '../../../lib/format';
import { summaryOf, type LogbookView, type SortField } from '../utils/filters';

export interface LogbookGridProps {
  rows: readonly LogbookEntry[];
  total: number;
  loading: boolean;
  view: LogbookView;
  timeZone: string;
  onView: (view: LogbookView) => void;
  onSelect: (entry: LogbookEntry) => void;
}

const SORTABLE: readonly SortField[] = ['seq', 'time', 'kind', 'actorName'];

/** The logbook as a grid: paged, sorted and filtered by the gateway (community grid, 100 a page at most). */
export function LogbookGrid({
  rows,
  total,
  loading,
  view,
  timeZone,
  onView,
  onSelect,
}: LogbookGridProps) {
  const columns: GridColDef<LogbookEntry>[] = [
    { field: 'seq', headerName: '#', width: 80, type: 'number' },
    {
      field: 'time',
      // when the gateway wrote it (its clock); the site time of the event is beside it
      headerName: 'Recorded',
      width: 200,
      valueFormatter: (value: string) => {
        const t = formatSiteTime(Date.parse(value), timeZone);
        return `${t.date} ${t.time} ${t.zone}`;
      },
    },
    {
      field: 'siteTime',
      headerName: 'Site time',
      width: 110,
      sortable: false,
      valueGetter: (_v, row) =>
        typeof row.payload.siteTime === 'string'
          ? formatSiteTime(Date.parse(row.payload.siteTime), timeZone).time
          : '',
    },
    { field: 'kind', headerName: 'Kind', width: 200 },
    {
      field: 'actorName',
      headerName: 'Who',
      width: 130,
      valueFormatter: (v: string | null) => v ?? 'gateway',
    },
    {
      field: 'controls',
      headerName: 'Gates',
      width: 140,
      sortable: false,
      valueGetter: (_v, row) =>
        Array.isArray(row.payload.controls) ? (row.payload.controls as string[]).join(', ') : '',
    },
    {
      field: 'summary',
      headerName: 'What',
      flex: 1,
      minWidth: 240,
      sortable: false,
      valueGetter: (_v, row) => summaryOf(row),
    },
  ];
  const sortModel: GridSortModel = [{ field: view.sort, sort: view.order }];
  return (
    <Box data-testid="logbook-grid" sx={{ minWidth: 0 }}>
      <DataGrid
        rows={rows}
        columns={columns}
        getRowId={(r) => r.seq}
        rowCount={total}
        loading={loading}
        paginationMode="server"
        sortingMode="server"
        filterMode="server"
        disableColumnFilter
        paginationModel={{ page: view.page, pageSize: view.pageSize }}
        pageSizeOptions={[25, 50, 100]}
        onPaginationModelChange={(m) => onView({ ...view, page: m.page, pageSize: m.pageSize })}
        sortModel={sortModel}
        onSortModelChange={(m) => {
          const first = m[0];
          const field = SORTABLE.includes(first?.field as SortField)
            ? (first!.field as SortField)
            : 'seq';
          onView({ ...view, page: 0, sort: field, order: first?.sort === 'asc' ? 'asc' : 'desc' });
        }}
        onRowClick={(p) => onSelect(p.row)}
        density="compact"
        autoHeight
      />
    </Box>
  );
}
