// The invented demo team. Names and addresses are made up; example.com is reserved for
// documentation (RFC 2606 §3), so no real mailbox receives anything sent to them.
import type { DemoPerson } from './types.js';

export const demoTeam: readonly DemoPerson[] = [
  { role: 'owner', name: 'Teodora Vance', email: 'teodora.vance@example.com', password: 'orbitab-demo-owner' },
  { role: 'editor', name: 'Ravi Lindqvist', email: 'ravi.lindqvist@example.com', password: 'orbitab-demo-editor' },
  { role: 'viewer', name: 'Mina Achterberg', email: 'mina.achterberg@example.com', password: 'orbitab-demo-viewer' },
];
