/** What `GET /api/instance` says about the server: its mode and the local fakes it runs. */
export type Instance = {
  mode: 'demo' | 'production';
  /** `payments`: the local test payment service; `mailbox`: the development mailbox. */
  fakes: ('payments' | 'mailbox')[];
  depositsOn: boolean;
};
