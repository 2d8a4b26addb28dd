const dateFormat = new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', year: 'numeric' });
const dateTimeFormat = new Intl.DateTimeFormat('en-US', {
  month: 'short',
  day: 'numeric',
  year: 'numeric',
  hour: 'numeric',
  minute: '2-digit',
});
const wholeNumber = new Intl.NumberFormat('en-US', { maximumFractionDigits: 0 });

export const formatDate = (iso: string) => dateFormat.format(new Date(iso));
export const formatDateTime = (iso: string) => dateTimeFormat.format(new Date(iso));
export const formatMiles = (miles: number | null) => (miles == null ? 'Odometer not recorded' : `${wholeNumber.format(miles)} mi`);
