/** Field limits shared by the API and the web forms. */
export const limits = {
  emailMax: 254,
  nameMax: 80,
  passwordMin: 10,
  passwordMax: 200,
  notesMax: 4000,
} as const;
