import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { inject, provideAppInitializer } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { provideRouter } from '@angular/router';
import type { InvitationView, MemberView, SessionView, WorkshopView } from '@benchtide/shared';
import { AccountSession } from '../core/account-session';
import { BenchIcons } from '../core/bench-icons';
import { WorkshopPage } from './workshop-page';

const RIVER: WorkshopView = { id: 'w-river', name: 'River Club', personal: false, role: 'owner', memberCount: 2 };
const COURSE: WorkshopView = { id: 'w-course', name: 'Resin Course', personal: false, role: 'viewer', memberCount: 2 };
const ADA: MemberView = {
  userId: 'u-ada',
  displayName: 'Ada Brush',
  email: 'ada@example.org',
  role: 'owner',
  joinedAt: '2026-01-10T09:00:00.000Z',
};
const BO: MemberView = {
  userId: 'u-bo',
  displayName: 'Bo Tide',
  email: 'bo@example.org',
  role: 'builder',
  joinedAt: '2026-02-01T09:00:00.000Z',
};
const CY_INVITED: InvitationView = {
  id: 'i-cy',
  email: 'cy@example.org',
  role: 'viewer',
  invitedBy: 'Ada Brush',
  expiresAt: '2026-12-09T10:00:00.000Z',
};
const NO_CONTENT = { status: 204, statusText: 'No Content' };
const LAST_OWNER = {
  error: { code: 'last_owner', message: 'River Club needs an owner: make another member owner first.' },
};

describe('WorkshopPage', () => {
  let fixture: ComponentFixture<WorkshopPage>;
  let loader: HarnessLoader;
  let http: HttpTestingController;

  async function render(workshops: readonly WorkshopView[]): Promise<void> {
    const session: SessionView = {
      account: { id: 'u-ada', email: 'ada@example.org', displayName: 'Ada Brush', emailVerified: true },
      workshops,
    };
    localStorage.setItem('benchtide.session', JSON.stringify(session));
    TestBed.configureTestingModule({
      imports: [WorkshopPage],
      providers: [
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideAppInitializer(() => inject(BenchIcons).register()),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(WorkshopPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  }

  async function answerRoster(
    workshopId: string,
    members: readonly MemberView[],
    invitations?: readonly InvitationView[],
  ): Promise<void> {
    http.expectOne({ method: 'GET', url: `/api/workshops/${workshopId}/members` }).flush(members);
    if (invitations) http.expectOne(`/api/workshops/${workshopId}/invitations`).flush(invitations);
    await settle();
  }

  async function settle(): Promise<void> {
    await new Promise((resolve) => setTimeout(resolve));
    await fixture.whenStable();
  }

  function query(selector: string): HTMLElement | null {
    return (fixture.nativeElement as HTMLElement).querySelector<HTMLElement>(selector);
  }

  function text(selector: string): string {
    return (query(selector)?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  async function press(label: string, ancestor?: string): Promise<void> {
    await (await loader.getHarness(MatButtonHarness.with({ text: label, ancestor }))).click();
  }

  async function type(label: string, value: string): Promise<void> {
    const field = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
    await (await field.getControl(MatInputHarness))?.setValue(value);
  }

  function roleSelect(userId: string): Promise<MatSelectHarness> {
    return loader.getHarness(MatSelectHarness.with({ ancestor: `[data-member="${userId}"]` }));
  }

  beforeEach(() => localStorage.clear());
  afterEach(() => {
    http.verify();
    localStorage.clear();
  });

  describe('for an owner', () => {
    beforeEach(async () => {
      await render([RIVER, COURSE]);
      await answerRoster('w-river', [ADA, BO], [CY_INVITED]);
    });

    it('should show the workshop with its members, their addresses and role selects', async () => {
      expect(text('[data-workshop-name]')).toBe('River Club');
      expect(text('[data-member="u-bo"] .name')).toBe('Bo Tide');
      expect(text('[data-member="u-bo"] .email')).toBe('bo@example.org');
      expect(await (await roleSelect('u-bo')).getValueText()).toBe('Builder');
      expect(await loader.getAllHarnesses(MatSelectHarness.with({ ancestor: 'bt-member-list' }))).toHaveSize(2);
    });

    it('should offer the whole record to download, as JSON and a CSV per table', () => {
      const link = (name: string) => query(`[data-export="${name}"]`) as HTMLAnchorElement;
      expect(link('json').getAttribute('href')).toBe('/api/workshops/w-river/export.json');
      expect(link('json').getAttribute('download')).toBe('benchtide-river-club-record.json');
      expect(link('ledger').textContent?.trim()).toBe('Stock book');
      expect(link('photos').getAttribute('href')).toBe('/api/workshops/w-river/export/photos.csv');
      expect(link('layers').textContent?.trim()).toBe('Pour layers');
      // one JSON download and one CSV per synced table: builds, steps, materials, containers, stock book, pours,
      // pour layers and photo records
      expect(fixture.nativeElement.querySelectorAll('[data-export]').length).toBe(9);
    });

    it('should show the invitations and the invite form', async () => {
      expect(text('[data-invitation="i-cy"] .email')).toBe('cy@example.org');
      expect(await loader.getHarnessOrNull(MatButtonHarness.with({ text: 'Send invitation' }))).not.toBeNull();
    });

    it('should change a member role', async () => {
      const select = await roleSelect('u-bo');
      await select.open();
      await select.clickOptions({ text: 'Viewer' });
      const request = http.expectOne({ method: 'PATCH', url: '/api/workshops/w-river/members/u-bo' });
      request.flush({ ...BO, role: 'viewer' });
      await settle();

      expect(request.request.body).toEqual({ role: 'viewer' });
      expect(await (await roleSelect('u-bo')).getValueText()).toBe('Viewer');
    });

    it('should say why the last owner cannot step down, and keep the role shown', async () => {
      const select = await roleSelect('u-ada');
      await select.open();
      await select.clickOptions({ text: 'Builder' });
      http.expectOne('/api/workshops/w-river/members/u-ada').flush(LAST_OWNER, { status: 409, statusText: 'Conflict' });
      await settle();

      expect(text('bt-member-list [role="alert"]')).toBe(LAST_OWNER.error.message);
      expect(await (await roleSelect('u-ada')).getValueText()).toBe('Owner');
    });

    it('should say why the last owner cannot leave', async () => {
      await press('Leave workshop');
      await press('Leave', '[data-member="u-ada"] .confirm');
      http
        .expectOne({ method: 'DELETE', url: '/api/workshops/w-river/members/u-ada' })
        .flush(LAST_OWNER, { status: 409, statusText: 'Conflict' });
      await settle();

      expect(text('bt-member-list [role="alert"]')).toBe(LAST_OWNER.error.message);
      expect(TestBed.inject(AccountSession).currentWorkshopId()).toBe('w-river');
    });

    it('should remove a member after a second tap', async () => {
      await press('Remove');
      expect(text('[data-member="u-bo"] .confirm p')).toBe('Remove Bo Tide from River Club?');

      await press('Remove', '[data-member="u-bo"] .confirm');
      http.expectOne({ method: 'DELETE', url: '/api/workshops/w-river/members/u-bo' }).flush(null, NO_CONTENT);
      await settle();

      expect(query('[data-member="u-bo"]')).toBeNull();
    });

    it('should send an invitation and list it', async () => {
      await type('Their e-mail', 'Dee@Example.org');
      const role = await loader.getHarness(MatSelectHarness.with({ ancestor: 'bt-invitation-list form' }));
      await role.open();
      await role.clickOptions({ text: 'Viewer' });
      await press('Send invitation');
      const request = http.expectOne({ method: 'POST', url: '/api/workshops/w-river/invitations' });
      request.flush({ ...CY_INVITED, id: 'i-dee', email: 'dee@example.org' }, { status: 201, statusText: 'Created' });
      await settle();

      expect(request.request.body).toEqual({ email: 'dee@example.org', role: 'viewer' });
      expect(text('[data-invitation="i-dee"] .email')).toBe('dee@example.org');
      expect(text('bt-invitation-list [role="status"]')).toBe(
        'Invitation sent to dee@example.org. The link in it works once, for 7 days.',
      );
    });

    it('should withdraw an invitation', async () => {
      await press('Withdraw');
      http.expectOne({ method: 'DELETE', url: '/api/workshops/w-river/invitations/i-cy' }).flush(null, NO_CONTENT);
      await settle();

      expect(query('[data-invitation="i-cy"]')).toBeNull();
    });

    it('should rename the workshop', async () => {
      await press('Rename');
      await type('Workshop name', 'River Club North');
      await press('Save name');
      const request = http.expectOne({ method: 'PATCH', url: '/api/workshops/w-river' });
      request.flush({ ...RIVER, name: 'River Club North' });
      await settle();

      expect(request.request.body).toEqual({ name: 'River Club North' });
      expect(text('[data-workshop-name]')).toBe('River Club North');
    });

    it('should switch to another workshop and remember it on this device', async () => {
      const switcher = await loader.getHarness(MatSelectHarness.with({ selector: '.switcher mat-select' }));
      await switcher.open();
      await switcher.clickOptions({ text: 'Resin Course' });
      await answerRoster('w-course', [{ ...ADA, role: 'viewer', email: undefined }]);

      expect(text('[data-workshop-name]')).toBe('Resin Course');
      expect(localStorage.getItem('benchtide.current-workshop')).toBe('w-course');
      expect(query('bt-invitation-list')).toBeNull();
    });

    it('should start a new workshop and work in it', async () => {
      await type('Workshop name', 'Diorama Course 2027');
      await press('Start workshop');
      const request = http.expectOne({ method: 'POST', url: '/api/workshops' });
      request.flush(
        { id: 'w-new', name: 'Diorama Course 2027', personal: false, role: 'owner', memberCount: 2 },
        { status: 201, statusText: 'Created' },
      );
      await settle();
      await answerRoster('w-new', [ADA], []);

      expect(request.request.body).toEqual({ name: 'Diorama Course 2027' });
      expect(text('[data-workshop-name]')).toBe('Diorama Course 2027');
    });
  });

  describe('for a viewer', () => {
    beforeEach(async () => {
      await render([COURSE]);
      // No invitations request: they are the owners' business.
      await answerRoster('w-course', [
        { ...ADA, userId: 'u-eve', displayName: 'Eve Cast', email: undefined },
        { ...ADA, role: 'viewer', email: undefined },
      ]);
    });

    it('should show roles as words, without selects, addresses or remove buttons', async () => {
      expect(await loader.getAllHarnesses(MatSelectHarness)).toHaveSize(0);
      expect(text('[data-member="u-eve"] .role-word')).toBe('Owner');
      expect(query('[data-member="u-eve"] .email')).toBeNull();
      expect(await loader.getHarnessOrNull(MatButtonHarness.with({ text: 'Remove' }))).toBeNull();
    });

    it('should hide the invitations, the rename button and the record downloads', async () => {
      expect(query('bt-invitation-list')).toBeNull();
      expect(query('bt-record-export')).toBeNull();
      expect(await loader.getHarnessOrNull(MatButtonHarness.with({ text: 'Send invitation' }))).toBeNull();
      expect(await loader.getHarnessOrNull(MatButtonHarness.with({ text: 'Rename' }))).toBeNull();
    });

    it('should let them leave the workshop', async () => {
      await press('Leave workshop');
      await press('Leave', '[data-member="u-ada"] .confirm');
      http.expectOne({ method: 'DELETE', url: '/api/workshops/w-course/members/u-ada' }).flush(null, NO_CONTENT);
      await settle();

      expect(TestBed.inject(AccountSession).workshops()).toEqual([]);
      expect(text('.bt-lead')).toContain('You are not in a workshop yet.');
    });
  });

  describe('without a connection', () => {
    it('should say the members cannot be loaded, and load them once asked again', async () => {
      await render([COURSE]);
      http.expectOne('/api/workshops/w-course/members').error(new ProgressEvent('error'));
      await settle();

      expect(text('bt-member-list [role="alert"]')).toContain('No connection');

      await press('Try again');
      await answerRoster('w-course', [{ ...ADA, role: 'viewer', email: undefined }]);

      expect(text('[data-member="u-ada"] .name')).toContain('Ada Brush');
      expect(query('bt-member-list [role="alert"]')).toBeNull();
    });
  });
});
