// The account forms' messages in the user's language. The shared schemas and the account routes
// write them in English (the server has no language of its own for a person not yet signed in);
// each known message has a translation under formError.<key>, anything else shows as written.
const known: [RegExp, string][] = [
  [/^Enter an e-mail address like /, 'email'],
  [/^Use at least 10 characters$/, 'passwordShort'],
  [/^At most (\d+) characters$/, 'atMost'],
  [/^Enter a name$/, 'enterName'],
  [/^Enter your password$/, 'enterPassword'],
  [/^Enter your current password$/, 'enterCurrentPassword'],
  [/^This is not your current password$/, 'notCurrentPassword'],
  [/^This link is not valid$/, 'linkInvalid'],
  [/^That e-mail and password do not match an account$/, 'wrongPair'],
  [/^Choose the company to sign in to$/, 'chooseCompany'],
  [/^This reset link is not valid any more/, 'resetSpent'],
  [/^This invitation link is not valid any more/, 'inviteSpent'],
  [/^This invitation was already used$/, 'inviteUsed'],
  [/^You are already a member of this company/, 'alreadyMemberSignIn'],
  [/^This is not the password of your Tamp account$/, 'notYourPassword'],
  [/^Some fields need a look$/, 'fieldsNeedLook'],
  [/^Someone on the roster already has this name/, 'sameName'],
]

/** The translation key of an English form message and its figure, if the message is one Tamp knows. */
export function formMessageKey(message: string): { key: string, n?: string } | undefined {
  for (const [pattern, key] of known) {
    const found = pattern.exec(message)
    if (found) return { key: `formError.${key}`, n: found[1] }
  }
  return undefined
}
