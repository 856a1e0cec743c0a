// Passwords that appear near the top of every published list of leaked passwords, restricted to
// those long enough to pass the length rule (common practice: reject them outright).
export const commonPasswords: ReadonlySet<string> = new Set([
  '1234567890', '0123456789', '0987654321', '12345678910', '123456789a', 'a123456789', '1q2w3e4r5t', '1qaz2wsx3edc',
  'qwertyuiop', 'qwerty1234', 'qwerty12345', 'qwerty123456', 'asdfghjkl1', 'zxcvbnm123', 'password1234', 'password123',
  'password12', 'password01', 'passw0rd123', 'p@ssw0rd123', 'iloveyou12', 'iloveyou123', 'abcdefghij', 'abcd123456',
  'abc1234567', 'aaaaaaaaaa', '1111111111', '0000000000', '2222222222', '9999999999', '1234512345', '1122334455',
  'letmein123', 'welcome123', 'welcome1234', 'admin12345', 'administrator', 'changeme123', 'football123', 'baseball123',
  'sunshine123', 'princess123', 'dragon12345', 'monkey12345', 'superman123', 'trustno1234', 'starwars123', 'computer123',
  'qazwsxedc123', 'michael123', 'jordan2323', 'master1234', 'shadow1234', 'whatever12', 'freedom123', 'internet123',
  'q1w2e3r4t5', 'q1w2e3r4t5y6', 'zaq12wsxcde', '987654321a', 'passwordpassword', 'qwertyqwerty', 'asdfasdfasdf',
  'demo-password', 'quietbridge', 'quietbridge1', 'quietbridge123',
]);
