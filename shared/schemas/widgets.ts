/**
 * The console's Widgets page: the widgets it can configure, their options, and the change to an embed key
 * (name, allowed origins) made beside the preview (`PATCH /console-api/keys/{keyId}`).
 */
import { z } from 'zod';

export const widgetTags = ['ohmstead-compatibility', 'ohmstead-pack-value', 'ohmstead-wire-fuse', 'ohmstead-charge-time'] as const;
export const WidgetTagSchema = z.enum(widgetTags);
export type WidgetTag = z.output<typeof WidgetTagSchema>;

export const UpdateApiKeyInputSchema = z
  .strictObject({
    name: z.string().trim().min(1, 'Give the key a name').max(80).optional().meta({ example: 'Product pages' }),
    allowedOrigins: z
      .array(z.string().trim().min(1).max(200))
      .max(50)
      .optional()
      .meta({ description: 'Embed keys only: the whole new list of sites (scheme://host[:port]) the key may be used from.', example: ['https://shop.example'] }),
  })
  .refine((v) => v.name !== undefined || v.allowedOrigins !== undefined, { message: 'Change the name, the allowed origins or both' })
  .meta({ id: 'UpdateApiKeyInput', description: 'A key\'s new name and/or (embed keys) its whole list of allowed origins.' });
export type UpdateApiKeyInput = z.output<typeof UpdateApiKeyInputSchema>;
