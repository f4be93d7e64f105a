import { useState } from 'react';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Typography from '@mui/material/Typography';
import { DataGrid, type GridColDef } from '@mui/x-data-grid';
import { formatDistance, type Contact, type Zone } from '@stillwell/shared/notices';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { Panel } from '../../../components/ui/panel';
import { ErrorMessage } from '../../../components/ui/state-message';
import { describeError } from '../../../lib/api-client';
import { useContacts } from '../api/get-contacts';
import { useZones } from '../api/get-zones';
import { useCan } from '../hooks/use-can';
import { minutes } from '../utils/times';
import { ContactDialog } from './contact-dialog';
import { ImportDialog } from './import-dialog';
import { ZONE_KIND_LABELS, ZoneDialog } from './zone-dialog';

const zoneColumns: GridColDef<Zone>[] = [
  { field: 'name', headerName: 'Zone', flex: 1, minWidth: 180 },
  {
    field: 'kind',
    headerName: 'Kind',
    width: 110,
    valueFormatter: (v: Zone['kind']) => ZONE_KIND_LABELS[v],
  },
  {
    field: 'distanceM',
    headerName: 'Below the dam',
    width: 130,
    valueFormatter: (v: number) => formatDistance(v),
  },
  { field: 'affectedAtM3s', headerName: 'Affected from, m3/s', width: 160, type: 'number' },
  {
    field: 'travelTimes',
    headerName: 'Travel time by release',
    flex: 1,
    minWidth: 240,
    sortable: false,
    valueFormatter: (v: Zone['travelTimes']) =>
      v.map((r) => `${r.releaseM3s} m3/s: ${minutes(r.travelTimeS)}`).join('; '),
  },
  { field: 'contactCount', headerName: 'Contacts', width: 100, type: 'number' },
];

const contactColumns: GridColDef<Contact>[] = [
  { field: 'zoneName', headerName: 'Zone', width: 190 },
  { field: 'escalationOrder', headerName: 'Chain', width: 80, type: 'number' },
  { field: 'organisation', headerName: 'Organisation', flex: 1, minWidth: 180 },
  { field: 'person', headerName: 'Person', width: 150 },
  { field: 'role', headerName: 'Role', width: 140 },
  { field: 'email', headerName: 'E-mail', flex: 1, minWidth: 200 },
  { field: 'phone', headerName: 'Phone', width: 150 },
  {
    field: 'leadTimeS',
    headerName: 'Lead time',
    width: 110,
    valueFormatter: (v: number) => minutes(v),
  },
  {
    field: 'ackWindowS',
    headerName: 'To answer',
    width: 110,
    valueFormatter: (v: number) => minutes(v),
  },
  {
    field: 'username',
    headerName: 'Sign-in',
    width: 120,
    valueFormatter: (v: string | null) => v ?? 'none',
  },
  { field: 'active', headerName: 'Active', width: 80, type: 'boolean' },
];

export interface RegistryScreenProps {
  definition: ReservoirDefinition;
}

/** The downstream registry: zones (entered by the engineer) and the people to tell (kept by the liaison). */
export function RegistryScreen({ definition }: RegistryScreenProps) {
  const zones = useZones(definition.id);
  const canZones = useCan('notices.manage');
  const canContacts = useCan('contacts.manage');
  const contacts = useContacts(definition.id, canContacts);
  const [zone, setZone] = useState<Zone | 'new' | null>(null);
  const [contact, setContact] = useState<Contact | 'new' | null>(null);
  const [importing, setImporting] = useState(false);
  return (
    <Box sx={{ display: 'grid', gap: 2 }}>
      <Panel
        title="Zones below the dam"
        aside={canZones && <Button onClick={() => setZone('new')}>Add a zone</Button>}
      >
        {zones.isError ? (
          <ErrorMessage
            title="The zones could not be loaded."
            detail={describeError(zones.error)}
          />
        ) : (
          <DataGrid
            aria-label="Zones"
            rows={zones.data ?? []}
            columns={zoneColumns}
            loading={zones.isPending}
            density="compact"
            autoHeight
            hideFooter
            onRowClick={(p) => canZones && setZone(p.row)}
          />
        )}
      </Panel>
      <Panel
        title="Contacts"
        aside={
          canContacts && (
            <Box sx={{ display: 'flex', gap: 1 }}>
              <Button onClick={() => setImporting(true)}>Import CSV</Button>
              <Button onClick={() => setContact('new')} disabled={!zones.data?.length}>
                Add a contact
              </Button>
            </Box>
          )
        }
      >
        {!canContacts ? (
          <Typography sx={{ color: 'text.secondary' }}>
            The downstream liaison keeps the list of contacts.
          </Typography>
        ) : contacts.isError ? (
          <ErrorMessage
            title="The contacts could not be loaded."
            detail={describeError(contacts.error)}
          />
        ) : (
          <DataGrid
            aria-label="Contacts"
            rows={contacts.data ?? []}
            columns={contactColumns}
            loading={contacts.isPending}
            density="compact"
            autoHeight
            pageSizeOptions={[25, 50, 100]}
            initialState={{ pagination: { paginationModel: { pageSize: 25 } } }}
            onRowClick={(p) => setContact(p.row)}
          />
        )}
      </Panel>
      {zone && (
        <ZoneDialog
          reservoirId={definition.id}
          zone={zone === 'new' ? null : zone}
          onClose={() => setZone(null)}
        />
      )}
      {contact && zones.data && (
        <ContactDialog
          reservoirId={definition.id}
          zones={zones.data}
          contact={contact === 'new' ? null : contact}
          onClose={() => setContact(null)}
        />
      )}
      {importing && (
        <ImportDialog reservoirId={definition.id} onClose={() => setImporting(false)} />
      )}
    </Box>
  );
}
