/**
 * A handlebars instance of our own for each renderer, without handlebars' `log` helper: `{{log …}}` in a
 * template override would write to the process's stdout, which carries the results of a command (and a
 * template's author has no business there). Without it, `{{log}}` is an ordinary, empty value, and
 * `{{log x}}` is an unknown helper, refused before rendering (templates.ts).
 */
import Handlebars from 'handlebars';

export function isolatedHandlebars(): typeof Handlebars {
  const hb = Handlebars.create();
  hb.unregisterHelper('log');
  return hb;
}
