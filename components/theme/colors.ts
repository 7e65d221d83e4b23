// Parallax palette: warm paper, deep ink, one blue-black "pen" accent.
// Dark keeps the same hues, lowered in lightness, so status reads the same in both.
export interface Palette {
  /** Page background: warm paper. */
  paper: string;
  /** Cards and panels, a shade lighter than the page. */
  surface: string;
  /** Wells, inputs, table headers: a shade darker than the page. */
  sunken: string;
  /** Hairlines and borders. */
  line: string;
  /** Stronger borders (inputs, focused rows). */
  lineStrong: string;
  ink: string;
  inkMuted: string;
  inkFaint: string;
  /** The one accent: links, the current place, primary buttons. Used sparingly. */
  accent: string;
  accentInk: string;
  accentWash: string;
  /** Status hues; never used alone (a status mark always adds a shape and a word). */
  good: string;
  goodWash: string;
  bad: string;
  badWash: string;
  caution: string;
  cautionWash: string;
  missing: string;
  focus: string;
  scrim: string;
  /**
   * Chart lines, one per step, in this order. Each also gets its own dash pattern
   * (tokens.chart.dashes), so steps never differ by colour alone.
   */
  series: readonly string[];
}

export const lightPalette: Palette = {
  paper: '#F4EFE4',
  surface: '#FBF8F1',
  sunken: '#EBE4D5',
  line: '#DDD4C3',
  lineStrong: '#B9AE99',
  ink: '#1E2330',
  inkMuted: '#555B68',
  inkFaint: '#7E8089',
  accent: '#34479A',
  accentInk: '#FBF8F1',
  accentWash: '#E3E3EE',
  good: '#356B45',
  goodWash: '#E2EAD9',
  bad: '#A23B2E',
  badWash: '#F3DDD3',
  caution: '#8A5F0E',
  cautionWash: '#F1E4C4',
  missing: '#77746C',
  focus: '#34479A',
  scrim: 'rgba(30, 35, 48, 0.32)',
  series: ['#34479A', '#8A5F0E', '#2F7A78', '#7A3F78', '#5B6B2E', '#555B68'],
};

export const darkPalette: Palette = {
  paper: '#1A1916',
  surface: '#23221E',
  sunken: '#141311',
  line: '#36342E',
  lineStrong: '#57534A',
  ink: '#ECE6D9',
  inkMuted: '#B4AD9F',
  inkFaint: '#8B857A',
  accent: '#9EAEEA',
  accentInk: '#161A2A',
  accentWash: '#282C3D',
  good: '#8DC49A',
  goodWash: '#223024',
  bad: '#E8968A',
  badWash: '#3A2420',
  caution: '#DDB662',
  cautionWash: '#362C17',
  missing: '#9A958A',
  focus: '#9EAEEA',
  scrim: 'rgba(0, 0, 0, 0.5)',
  series: ['#9EAEEA', '#DDB662', '#7FC6C2', '#D39BD0', '#B5C77E', '#B4AD9F'],
};
