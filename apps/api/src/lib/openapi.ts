// Teaches zod the `.openapi()` method the document generator relies on; import before registering.
import { extendZodWithOpenApi } from '@asteasolutions/zod-to-openapi';
import { z } from 'zod';

extendZodWithOpenApi(z);
