import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatToolbarModule } from '@angular/material/toolbar';
import { RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { Auth } from './core/auth';
import type { Role } from './core/models';

interface NavLink {
  path: string;
  label: string;
  icon: string;
  roles: Role[];
}

const LINKS: NavLink[] = [
  {
    path: '/projects',
    label: 'Projects',
    icon: 'folder_open',
    roles: ['admin', 'engineer', 'reviewer', 'viewer'],
  },
  { path: '/reviews', label: 'To review', icon: 'fact_check', roles: ['admin', 'reviewer'] },
  { path: '/admin/users', label: 'Users', icon: 'group', roles: ['admin'] },
  { path: '/admin/tokens', label: 'API tokens', icon: 'key', roles: ['admin'] },
];

/** The shell: the Scarpline bar (name, the links the role may use, the user), then the page. */
@Component({
  selector: 'sl-root',
  imports: [
    RouterOutlet,
    RouterLink,
    RouterLinkActive,
    MatToolbarModule,
    MatButtonModule,
    MatIconModule,
    MatMenuModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './app.html',
  styleUrl: './app.scss',
})
export class App {
  protected readonly auth = inject(Auth);
  protected readonly links = computed(() => {
    const u = this.auth.user();
    // none until an invitation's password is replaced: the role guard allows nothing else
    return u && !u.mustChangePassword ? LINKS.filter((l) => l.roles.includes(u.role)) : [];
  });
}
