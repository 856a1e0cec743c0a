import { PASSWORD_MIN_LENGTH as CONTRACT_MIN_LENGTH, roles } from '@shared/contracts/user';
import { PASSWORD_MIN_LENGTH, ROLES } from './account-rules';

describe('account rules', () => {
  it('should ask for the minimum password length the API enforces', () => {
    expect(PASSWORD_MIN_LENGTH).toBe(CONTRACT_MIN_LENGTH);
  });

  it('should offer exactly the roles of the contract', () => {
    expect([...ROLES]).toEqual([...roles]);
  });
});
