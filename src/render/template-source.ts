/** A template, partial or style sheet as read, built in or from the job's templates folder. */
export interface TemplateSource {
  /** The partial's name (file name without .hbs), 'brief' for the main template, 'brief.css' for the CSS. */
  name: string;
  /** Path of the file read, for messages. */
  file: string;
  text: string;
  /** True when the file came from the job's templates folder. */
  override: boolean;
}
