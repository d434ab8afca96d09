import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { AdminApi } from './admin-api';

describe('AdminApi', () => {
  let api: AdminApi;
  let backend: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting()],
    });
    api = TestBed.inject(AdminApi);
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => backend.verify());

  it('lists users with GET /api/v1/users', () => {
    let names: string[] = [];
    api.users().subscribe((list) => (names = list.map((u) => u.name)));
    const req = backend.expectOne('/api/v1/users');
    expect(req.request.method).toBe('GET');
    req.flush([{ id: 1, email: 'a@x.example', name: 'Ann', role: 'admin', active: true }]);
    expect(names).toEqual(['Ann']);
  });

  it('invites with POST /api/v1/users and sends no password', () => {
    api.invite({ name: 'Nia', email: 'nia@x.example', role: 'reviewer' }).subscribe();
    const req = backend.expectOne('/api/v1/users');
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toEqual({ name: 'Nia', email: 'nia@x.example', role: 'reviewer' });
    expect('password' in req.request.body).toBe(false);
    req.flush({ id: 9, email: 'nia@x.example', name: 'Nia', role: 'reviewer', active: true });
  });

  it('changes a user with PATCH /api/v1/users/:id and only the fields given', () => {
    api.updateUser(7, { role: 'viewer' }).subscribe();
    const role = backend.expectOne('/api/v1/users/7');
    expect(role.request.method).toBe('PATCH');
    expect(role.request.body).toEqual({ role: 'viewer' });
    role.flush({ id: 7, email: 'b@x.example', name: 'Bo', role: 'viewer', active: true });

    api.updateUser(7, { active: false }).subscribe();
    const active = backend.expectOne('/api/v1/users/7');
    expect(active.request.method).toBe('PATCH');
    expect(active.request.body).toEqual({ active: false });
    active.flush({ id: 7, email: 'b@x.example', name: 'Bo', role: 'viewer', active: false });
  });

  it('lists, creates and revokes integration tokens under /api/v1/tokens', () => {
    api.tokens().subscribe();
    expect(backend.expectOne('/api/v1/tokens').request.method).toBe('GET');

    api.createToken({ userId: 5, name: 'GIS feed', projectIds: [1, 3], days: 30 }).subscribe();
    const create = backend.expectOne('/api/v1/tokens');
    expect(create.request.method).toBe('POST');
    expect(create.request.body).toEqual({
      userId: 5,
      name: 'GIS feed',
      projectIds: [1, 3],
      days: 30,
    });

    api.revokeToken(4).subscribe();
    expect(backend.expectOne('/api/v1/tokens/4').request.method).toBe('DELETE');

    api.projects().subscribe();
    expect(backend.expectOne('/api/v1/projects').request.method).toBe('GET');
  });
});
