/** What a list of sets needs to show form-check videos; canManage for the sets' owner (add, delete). */
export interface SetVideoState {
  canManage: boolean
  uploading: Record<string, boolean>
  messages: Record<string, string>
  /** The video whose address is being fetched, if any. */
  opening: number | null
}
