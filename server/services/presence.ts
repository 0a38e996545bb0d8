// Who has a workbook open (one entry per person, however many tabs) and where their cursor is. In
// this process's memory: presence is only true while a connection is, so it must not outlive one.
import type { PresenceInput, PresenceUser } from '../../shared/team.js';

export interface LiveConnection {
  userId: string;
  name: string;
  /** Writes one Server-Sent Event to this connection. */
  send(event: string, data: unknown, id?: number): void;
  /** Ends the stream (the request's close handler then leaves the board). */
  end(): void;
}

interface WorkbookRoom {
  connections: Set<LiveConnection>;
  cells: Map<string, PresenceInput>;
}

export class PresenceBoard {
  private readonly rooms = new Map<string, WorkbookRoom>();

  private room(workbookId: string): WorkbookRoom {
    let room = this.rooms.get(workbookId);
    if (!room) this.rooms.set(workbookId, (room = { connections: new Set(), cells: new Map() }));
    return room;
  }

  join(workbookId: string, connection: LiveConnection): void {
    this.room(workbookId).connections.add(connection);
  }

  leave(workbookId: string, connection: LiveConnection): void {
    const room = this.rooms.get(workbookId);
    if (!room) return;
    room.connections.delete(connection);
    // The cursor goes when the person's last tab does.
    if (![...room.connections].some((c) => c.userId === connection.userId)) room.cells.delete(connection.userId);
    if (room.connections.size === 0) this.rooms.delete(workbookId);
  }

  /** Records a cursor; false when the user has no open stream on the workbook (nothing to show). */
  moveCursor(workbookId: string, userId: string, cell: PresenceInput): boolean {
    const room = this.rooms.get(workbookId);
    if (!room || ![...room.connections].some((c) => c.userId === userId)) return false;
    room.cells.set(userId, cell);
    return true;
  }

  connections(workbookId: string): LiveConnection[] {
    return [...(this.rooms.get(workbookId)?.connections ?? [])];
  }

  /** One entry per connected person, in the order they arrived. */
  users(workbookId: string): PresenceUser[] {
    const room = this.rooms.get(workbookId);
    if (!room) return [];
    const byUser = new Map<string, PresenceUser>();
    for (const c of room.connections) {
      if (!byUser.has(c.userId)) byUser.set(c.userId, { userId: c.userId, name: c.name, cell: room.cells.get(c.userId) ?? null });
    }
    return [...byUser.values()];
  }

  broadcast(workbookId: string): void {
    const users = this.users(workbookId);
    for (const c of this.connections(workbookId)) c.send('presence', { users });
  }
}
