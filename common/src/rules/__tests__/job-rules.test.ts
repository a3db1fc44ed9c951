import {
  ACTIVE_JOB_STATUSES,
  BENCH_ROLES,
  BUDGET_ROLES,
  JOB_TRANSITIONS,
  LAB_ROLES,
  LOCKED_JOB_STATUSES,
  MANAGER_ROLES,
  OPEN_JOB_STATUSES,
  STUDY_ROLES,
  jobTransitionRefusal,
} from '../index.js';
import { JOB_STATUSES, ROLES } from '../../types/index.js';

// The lab's division of work (the product's table of roles; common practice, no published source):
// a client sees only its own records, an engineer reads and runs studies, technicians and leads work at the
// bench, a lead signs. The sets below are written out here as the brief states them, not read from the code.
describe('role sets', () => {
  it('name the roles the product brief gives each kind of work', () => {
    expect([...LAB_ROLES].sort()).toEqual(['admin', 'engineer', 'lead', 'technician']);
    expect([...BENCH_ROLES].sort()).toEqual(['admin', 'lead', 'technician']);
    expect([...MANAGER_ROLES].sort()).toEqual(['admin', 'lead']);
    expect([...BUDGET_ROLES].sort()).toEqual(['lead', 'technician']);
    expect([...STUDY_ROLES].sort()).toEqual(['engineer', 'lead']);
  });

  it('never let a client in, and use only known roles', () => {
    for (const set of [LAB_ROLES, BENCH_ROLES, MANAGER_ROLES, BUDGET_ROLES, STUDY_ROLES]) {
      expect(set).not.toContain('client');
      for (const role of set) expect(ROLES).toContain(role);
    }
  });
});

describe('job status sets', () => {
  it('split the six statuses: open ones take work, locked ones are signed, active ones are all but signed', () => {
    expect([...OPEN_JOB_STATUSES].sort()).toEqual(['in_progress', 'received', 'returned']);
    expect([...LOCKED_JOB_STATUSES].sort()).toEqual(['approved', 'issued']);
    expect([...ACTIVE_JOB_STATUSES].sort()).toEqual(['in_progress', 'in_review', 'received', 'returned']);
    for (const status of JOB_STATUSES) expect(ACTIVE_JOB_STATUSES.includes(status)).toBe(!LOCKED_JOB_STATUSES.includes(status));
  });
});

describe('jobTransitionRefusal', () => {
  it('lets the bench start and submit work, and refuses an engineer or a client with 403', () => {
    expect(jobTransitionRefusal('received', 'in_progress', 'technician')).toBeNull();
    expect(jobTransitionRefusal('in_progress', 'in_review', 'lead')).toBeNull();
    expect(jobTransitionRefusal('returned', 'in_review', 'admin')).toBeNull();
    expect(jobTransitionRefusal('received', 'in_progress', 'engineer')).toEqual({
      status: 403,
      message: 'moving a job from received to in_progress needs one of the roles: admin, lead, technician',
    });
    expect(jobTransitionRefusal('in_progress', 'in_review', 'client')?.status).toBe(403);
  });

  it('sends signing and returning to their own routes and refuses moves no one may make with 409', () => {
    expect(jobTransitionRefusal('in_review', 'approved', 'lead')).toEqual({
      status: 409,
      message: 'a job becomes approved when the lead signs it (POST /api/jobs/:id/sign), not by a status change',
    });
    expect(jobTransitionRefusal('in_review', 'returned', 'lead')?.message).toMatch(/POST \/api\/jobs\/:id\/return/);
    expect(jobTransitionRefusal('received', 'in_review', 'lead')).toEqual({ status: 409, message: 'a job cannot go from received to in_review' });
    expect(jobTransitionRefusal('issued', 'in_progress', 'admin')?.status).toBe(409);
  });

  it('has a row for every status, and no move out of review, approval or issue', () => {
    expect(Object.keys(JOB_TRANSITIONS).sort()).toEqual([...JOB_STATUSES].sort());
    for (const from of ['in_review', 'approved', 'issued'] as const) expect(JOB_TRANSITIONS[from]).toEqual({});
  });
});
