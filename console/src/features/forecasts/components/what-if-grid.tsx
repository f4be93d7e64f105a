import { useMemo, useState } from 'react';
import Box from '@mui/material/Box';
import IconButton from '@mui/material/IconButton';
import Link from '@mui/material/Link';
import Typography from '@mui/material/Typography';
import DeleteOutlineIcon from '@mui/icons-material/DeleteOutlined';
import {
  DataGrid,
  type GridColDef,
  type GridPaginationModel,
  type GridValidRowModel,
} from '@mui/x-data-grid';
import { rowMessage, type FormProblem } from '../utils/what-if-request';

export interface WhatIfGridProps<R extends GridValidRowModel & { id: number }> {
  /** names the grid for screen readers and tests, e.g. "Inflow hydrograph" */
  label: string;
  testId: string;
  rows: readonly R[];
  /** the editable columns; the row number, its problems and a delete button are added */
  columns: GridColDef<R>[];
  onRowsChange: (rows: R[]) => void;
  /** this table's problems (rows from 1) */
  problems: readonly FormProblem[];
  /** request column (t, q, time, id, target) to the grid field it is typed in */
  fieldOf: Record<string, string>;
  /** request column to the header a person sees, for the messages beside the rows */
  columnLabels: Record<string, string>;
  pageSize?: number;
  disabled?: boolean;
}

const PAGE_SIZES = [10, 25, 50, 100];

/**
 * A table edited in place (double-click or Enter on a cell), in the order typed: never sorted, so
 * row numbers stay those the checks and the gateway name. A row's problems are written beside it
 * and its offending cells outlined; every problem of the table is listed under it, each a link to
 * the row's page.
 */
export function WhatIfGrid<R extends GridValidRowModel & { id: number }>({
  label,
  testId,
  rows,
  columns,
  onRowsChange,
  problems,
  fieldOf,
  columnLabels,
  pageSize = 10,
  disabled = false,
}: WhatIfGridProps<R>) {
  const [pagination, setPagination] = useState<GridPaginationModel>({ page: 0, pageSize });
  const rowNumber = useMemo(() => new Map(rows.map((r, i) => [r.id, i + 1])), [rows]);
  const byRow = useMemo(() => {
    const map = new Map<number, FormProblem[]>();
    for (const p of problems) {
      if (p.row === undefined) continue;
      map.set(p.row, [...(map.get(p.row) ?? []), p]);
    }
    return map;
  }, [problems]);
  const badCells = useMemo(
    () =>
      new Set(
        problems
          .filter((p) => p.row !== undefined && p.column)
          .map((p) => `${p.row}:${fieldOf[p.column!] ?? p.column}`),
      ),
    [problems, fieldOf],
  );

  const editable: GridColDef<R>[] = [
    {
      field: '__row',
      headerName: '#',
      width: 48,
      sortable: false,
      editable: false,
      valueGetter: (_v, row) => rowNumber.get(row.id),
    },
    ...columns.map((c) => ({ ...c, sortable: false, editable: !disabled && c.editable })),
  ];
  // the problem column only while there is something to say: an empty one crowds a narrow table
  const problemColumn: GridColDef<R>[] = [
    {
      field: '__problem',
      headerName: 'Problem',
      flex: 1,
      minWidth: 160,
      sortable: false,
      editable: false,
      valueGetter: (_v, row) =>
        (byRow.get(rowNumber.get(row.id) ?? 0) ?? [])
          .map((p) => rowMessage(p, columnLabels))
          .join('; '),
      renderCell: (params) =>
        params.value ? (
          <Typography
            variant="body2"
            component="span"
            sx={{ color: 'signal.alarm', whiteSpace: 'normal', lineHeight: 1.3 }}
            data-testid={`${testId}-problem-${rowNumber.get(params.row.id)}`}
          >
            {String(params.value)}
          </Typography>
        ) : null,
    },
  ];
  const deleteColumn: GridColDef<R> = {
    field: '__delete',
    headerName: '',
    width: 56,
    sortable: false,
    editable: false,
    renderCell: (params) => (
      <IconButton
        size="small"
        disabled={disabled}
        aria-label={`Delete row ${rowNumber.get(params.row.id)}`}
        onClick={() => onRowsChange(rows.filter((r) => r.id !== params.row.id))}
      >
        <DeleteOutlineIcon fontSize="small" />
      </IconButton>
    ),
  };
  const all = [...editable, ...(byRow.size > 0 ? problemColumn : []), deleteColumn];

  const goTo = (row: number) =>
    setPagination((m) => ({ ...m, page: Math.floor((row - 1) / m.pageSize) }));
  const listed = problems.slice(0, 12);

  return (
    <Box data-testid={testId} sx={{ minWidth: 0 }}>
      <DataGrid
        aria-label={label}
        rows={rows as R[]}
        columns={all}
        getRowId={(r) => r.id}
        density="compact"
        autoHeight
        disableColumnFilter
        disableColumnMenu
        disableRowSelectionOnClick
        getRowHeight={() => 'auto'}
        paginationModel={pagination}
        onPaginationModelChange={setPagination}
        pageSizeOptions={PAGE_SIZES}
        getCellClassName={(params) =>
          badCells.has(`${rowNumber.get(params.row.id)}:${params.field}`) ? 'cell-problem' : ''
        }
        processRowUpdate={(updated: R) => {
          onRowsChange(rows.map((r) => (r.id === updated.id ? updated : r)));
          return updated;
        }}
        sx={{
          '& .cell-problem': {
            outline: '1px solid',
            outlineColor: 'signal.alarm',
            outlineOffset: '-2px',
          },
          '& .MuiDataGrid-cell': { display: 'flex', alignItems: 'center', py: 0.5 },
        }}
      />
      {problems.length > 0 && (
        <Box
          component="ul"
          role="alert"
          aria-label={`Problems in ${label}`}
          sx={{ color: 'signal.alarm', pl: 2.5, my: 1, fontSize: '0.9rem' }}
        >
          {listed.map((p, i) => (
            <li key={`${i}:${p.message}`}>
              {p.row !== undefined && p.row <= rows.length ? (
                <Link
                  component="button"
                  type="button"
                  onClick={() => goTo(p.row!)}
                  sx={{ color: 'inherit', textAlign: 'left', verticalAlign: 'baseline' }}
                >
                  {p.message}
                </Link>
              ) : (
                p.message
              )}
            </li>
          ))}
          {problems.length > listed.length && (
            <li>{problems.length - listed.length} more problem(s)</li>
          )}
        </Box>
      )}
    </Box>
  );
}
